import { describe, expect, it } from 'vitest';
import { hfeWithinTolerance, matchSets } from '../../../shared/domain/matching/index.ts';
import {
  mulberry32,
  orderPlanSteps,
  planOrderQuantity,
  PlanningInputError,
  simulatedLot,
  type PlanPart,
  type SetMatcher,
} from '../../../shared/domain/planning/index.ts';
import { normalSample } from '../statistics/seeded-random.ts';

/**
 * A matcher that is exact for pairs under an hFE-only tolerance: sorted by hFE, pairing each part
 * with the next one when compatible (else skipping it) gives a maximum matching, because the
 * compatibility of sorted readings is an interval relation. Used to test the planner on its own.
 */
const pairsByHfe: SetMatcher = (parts, t) => {
  const order = parts.map((_, i) => i).sort((a, b) => parts[a]!.hfe - parts[b]!.hfe);
  const leftover: number[] = [];
  let sets = 0;
  for (let k = 0; k < order.length; k++) {
    const a = order[k]!;
    const b = order[k + 1];
    if (b !== undefined && hfeWithinTolerance(parts[a]!.hfe, parts[b]!.hfe, t.hfeTolerancePct)) {
      sets++;
      k++;
    } else leftover.push(a);
  }
  return { sets, leftover };
};

// Invented history: 240 parts around hFE 180 (sd 25), Vbe 650 mV (sd 4).
const hfe = normalSample(7, 240, 180, 25);
const vbe = normalSample(8, 240, 650, 4);
const history: PlanPart[] = hfe.map((h, i) => ({ hfe: h, vbeMv: vbe[i]! }));
const base = { history, setsWanted: 30, setSize: 2 as const, hfeTolerancePct: 0.5, vbeToleranceMv: 1000, confidence: 0.9, simulations: 60 };

/** The real matching (shared/domain/matching), as the server runs it. */
const realMatching: SetMatcher = (parts, t) => {
  const r = matchSets(
    parts.map((p, i) => ({ id: i, polarity: 'NPN' as const, hfe: p.hfe, vbeMv: p.vbeMv })),
    { hfeTolerancePct: t.hfeTolerancePct, vbeToleranceMv: t.vbeToleranceMv, setSize: t.setSize, mode: 'same' },
  );
  return { sets: r.sets.length, leftover: r.unmatched as number[] };
};

describe('planOrderQuantity', () => {
  it('with the real matchSets gives the same answer as the exact hFE-only matcher when Vbe does not bind', () => {
    const a = planOrderQuantity(base, mulberry32(11), pairsByHfe);
    const b = planOrderQuantity(base, mulberry32(11), realMatching);
    expect(b.quantity).toBe(a.quantity);
    expect(b.curve).toEqual(a.curve);
  });

  it('with the real matchSets, a binding Vbe tolerance needs more parts than hFE alone', () => {
    const loose = planOrderQuantity(base, mulberry32(12), realMatching);
    const tight = planOrderQuantity({ ...base, vbeToleranceMv: 1 }, mulberry32(12), realMatching);
    expect(tight.quantity!).toBeGreaterThan(loose.quantity!);
  });

  it('is reproducible: the same seed gives the same answer', () => {
    const a = planOrderQuantity(base, mulberry32(42), pairsByHfe);
    const b = planOrderQuantity(base, mulberry32(42), pairsByHfe);
    expect(a).toEqual(b);
    expect(a.quantity).not.toBeNull();
  });

  it('finds exactly the quantity a brute-force scan of every simulated lot finds', () => {
    const r = planOrderQuantity(base, mulberry32(5), pairsByHfe);
    // Recreate the lots from the same seed sequence and scan Q upward one part at a time.
    const rng = mulberry32(5);
    const thresholds: number[] = [];
    for (let i = 0; i < base.simulations; i++) {
      const lot = simulatedLot(history, Math.floor(rng() * 4294967296));
      let q = 60;
      while (pairsByHfe(lot.prefix(q), base).sets < base.setsWanted) q++;
      thresholds.push(q);
    }
    thresholds.sort((x, y) => x - y);
    const expected = thresholds[Math.ceil(base.confidence * base.simulations) - 1];
    expect(r.quantity).toBe(expected);
    expect(r.thresholds).toEqual({ min: thresholds[0], median: thresholds[30], max: thresholds[59] });
    // Far fewer matching calls than the scan needed.
    expect(r.matcherCalls).toBeLessThan(base.simulations * 10 + 100);
  });

  it('returns a rising curve whose first point at or above the confidence is the answer', () => {
    const r = planOrderQuantity(base, mulberry32(9), pairsByHfe);
    for (let i = 1; i < r.curve.length; i++) {
      expect(r.curve[i]!.quantity).toBeGreaterThan(r.curve[i - 1]!.quantity);
      expect(r.curve[i]!.probability).toBeGreaterThan(r.curve[i - 1]!.probability);
    }
    const idx = r.curve.findIndex((c) => c.quantity === r.quantity);
    expect(r.curve[idx]!.probability).toBeGreaterThanOrEqual(0.9);
    if (idx > 0) expect(r.curve[idx - 1]!.probability).toBeLessThan(0.9);
    expect(r.curve.at(-1)!.probability).toBe(1);
  });

  it('a higher confidence or a tighter tolerance needs at least as many parts', () => {
    const p90 = planOrderQuantity(base, mulberry32(3), pairsByHfe).quantity!;
    const p99 = planOrderQuantity({ ...base, confidence: 0.99 }, mulberry32(3), pairsByHfe).quantity!;
    const tight = planOrderQuantity({ ...base, hfeTolerancePct: 0.2 }, mulberry32(3), pairsByHfe).quantity!;
    expect(p99).toBeGreaterThanOrEqual(p90);
    expect(tight).toBeGreaterThan(p90);
    expect(p90).toBeGreaterThanOrEqual(60);
  });

  it('reports the expected leftovers per gain bin at the answer', () => {
    const bins = [
      { code: 'A', label: 'A', hfeMin: 100, hfeMax: 160 },
      { code: 'B', label: 'B', hfeMin: 160, hfeMax: 220 },
      { code: 'C', label: 'C', hfeMin: 220, hfeMax: 300 },
    ];
    const r = planOrderQuantity({ ...base, bins }, mulberry32(4), pairsByHfe);
    const total = r.leftovers.reduce((a, l) => a + l.expected, 0);
    expect(r.leftovers.map((l) => l.code)).toEqual(expect.arrayContaining(['A', 'B', 'C']));
    expect(total + 2 * r.expectedSets!).toBeCloseTo(r.quantity!, 6);
    expect(r.expectedSets!).toBeGreaterThanOrEqual(30);
  });

  it('says so when no quantity up to the maximum reaches the sets', () => {
    const r = planOrderQuantity({ ...base, hfeTolerancePct: 0, maxQuantity: 400 }, mulberry32(1), pairsByHfe);
    expect(r.quantity).toBeNull();
    expect(r.unreachable).toBeGreaterThan(0);
    expect(r.leftovers).toEqual([]);
  });

  it('yields progress after every simulated lot', () => {
    const steps = orderPlanSteps({ ...base, simulations: 20 }, mulberry32(2), pairsByHfe);
    const seen: number[] = [];
    for (let n = steps.next(); !n.done; n = steps.next()) if (n.value.phase === 'simulating') seen.push(n.value.done);
    expect(seen).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
  });

  it.each([
    [{ setsWanted: 0 }, 'setsWanted'],
    [{ confidence: 1.2 }, 'confidence'],
    [{ history: history.slice(0, 5) }, 'history'],
    [{ setSize: 3 }, 'setSize'],
  ])('refuses bad input %j, naming %s', (patch, field) => {
    try {
      planOrderQuantity({ ...base, ...(patch as object) }, mulberry32(1), pairsByHfe);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(PlanningInputError);
      expect((e as PlanningInputError).field).toBe(field);
    }
  });
});

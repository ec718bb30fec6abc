import { describe, it, expect } from 'vitest';
import reference from 'edmonds-blossom-fixed';
import {
  MatchingInputError,
  describeMismatch,
  hfeSpreadPct,
  hfeWithinTolerance,
  matchSets,
  setMismatch,
  vbeWithinTolerance,
  type MatchOptions,
  type MatchPart,
  type MatchResult,
} from '../../../shared/domain/matching/index.ts';
import { mulberry32 } from './helpers.ts';
import { normalSample } from '../statistics/seeded-random.ts';

// Independent restatement of the contract: a set is valid when every pair in it is within both
// tolerances (same polarity, or one NPN + one PNP comparing |Vbe|); its mismatch is setMismatch of
// its extreme spreads.
function vbeOf(p: MatchPart, o: MatchOptions): number {
  return o.mode === 'complementary' ? Math.abs(p.vbeMv) : p.vbeMv;
}
function compatible(a: MatchPart, b: MatchPart, o: MatchOptions): boolean {
  if (o.mode === 'same' ? a.polarity !== b.polarity : a.polarity === b.polarity) return false;
  return hfeWithinTolerance(a.hfe, b.hfe, o.hfeTolerancePct) && vbeWithinTolerance(vbeOf(a, o), vbeOf(b, o), o.vbeToleranceMv);
}
function mismatchOf(set: MatchPart[], o: MatchOptions): number {
  const h = set.map((p) => p.hfe);
  const v = set.map((p) => vbeOf(p, o));
  return setMismatch(hfeSpreadPct(Math.min(...h), Math.max(...h)), Math.max(...v) - Math.min(...v), o.hfeTolerancePct, o.vbeToleranceMv);
}

/** Exhaustive search: the most sets, then the least total mismatch. */
function bruteForce(parts: MatchPart[], o: MatchOptions): { sets: number; total: number } {
  let best = { sets: 0, total: 0 };
  const used = new Array<boolean>(parts.length).fill(false);
  const k = o.setSize;
  const visit = (from: number, sets: number, total: number): void => {
    let a = from;
    while (a < parts.length && used[a]) a++;
    if (a >= parts.length) {
      if (sets > best.sets || (sets === best.sets && total < best.total)) best = { sets, total };
      return;
    }
    used[a] = true;
    visit(a + 1, sets, total);
    const pick = (start: number, chosen: number[]): void => {
      if (chosen.length === k) {
        const set = chosen.map((i) => parts[i]!);
        visit(a + 1, sets + 1, total + mismatchOf(set, o));
        return;
      }
      for (let b = start; b < parts.length; b++) {
        if (used[b] || !chosen.every((c) => compatible(parts[c]!, parts[b]!, o))) continue;
        used[b] = true;
        pick(b + 1, [...chosen, b]);
        used[b] = false;
      }
    };
    pick(a + 1, [a]);
    used[a] = false;
  };
  visit(0, 0, 0);
  return best;
}

/** Checks a result is a valid answer: disjoint sets, all within tolerance, ids accounted for. */
function expectValid(parts: MatchPart[], o: MatchOptions, r: MatchResult): void {
  const byId = new Map(parts.map((p) => [p.id, p]));
  const seen = new Set<string | number>();
  for (const s of r.sets) {
    expect(s.partIds).toHaveLength(o.setSize);
    const set = s.partIds.map((id) => byId.get(id)!);
    for (let i = 0; i < set.length; i++) for (let j = i + 1; j < set.length; j++) expect(compatible(set[i]!, set[j]!, o)).toBe(true);
    expect(s.mismatch).toBeCloseTo(mismatchOf(set, o), 12);
    for (const id of s.partIds) {
      expect(seen.has(id)).toBe(false);
      seen.add(id);
    }
  }
  for (const id of r.unmatched) {
    expect(seen.has(id)).toBe(false);
    seen.add(id);
  }
  expect(seen.size).toBe(parts.length);
}

function total(r: MatchResult): number {
  return r.sets.reduce((s, x) => s + x.mismatch, 0);
}

function randomParts(rng: () => number, n: number, polarities: 'NPN' | 'mixed'): MatchPart[] {
  return Array.from({ length: n }, (_, i) => ({
    id: i % 3 === 0 ? i : `Q${i}`,
    polarity: polarities === 'NPN' || rng() < 0.5 ? ('NPN' as const) : ('PNP' as const),
    // Coarse readings give ties and dense graphs, fine ones sparse graphs.
    hfe: rng() < 0.5 ? 180 + Math.round(rng() * 20) : 150 + rng() * 100,
    vbeMv: (polarities === 'mixed' && rng() < 0.3 ? -1 : 1) * (645 + Math.round(rng() * 100) / 10),
  }));
}

describe('matchSets — pairs against exhaustive search', () => {
  const modes: { situation: string; polarities: 'NPN' | 'mixed'; mode: 'same' | 'complementary' }[] = [
    { situation: 'same polarity, NPN only', polarities: 'NPN', mode: 'same' },
    { situation: 'same polarity, NPN and PNP mixed', polarities: 'mixed', mode: 'same' },
    { situation: 'complementary NPN + PNP', polarities: 'mixed', mode: 'complementary' },
  ];
  it.each(modes)('$situation: on 300 seeded instances of 2–10 parts, the same number of sets and the same least total mismatch', ({ polarities, mode }) => {
    const rng = mulberry32(mode === 'same' ? (polarities === 'NPN' ? 1 : 2) : 3);
    for (let t = 0; t < 300; t++) {
      const parts = randomParts(rng, 2 + Math.floor(rng() * 9), polarities);
      const o: MatchOptions = { hfeTolerancePct: rng() * 12, vbeToleranceMv: rng() * 4, setSize: 2, mode };
      const r = matchSets(parts, o);
      expectValid(parts, o, r);
      const best = bruteForce(parts, o);
      expect(r.sets).toHaveLength(best.sets);
      // Exact up to the 2^-26 rounding of each set's mismatch inside the solver.
      expect(Math.abs(total(r) - best.total)).toBeLessThan(1e-6);
      expect(r.optimal).toBe(true);
    }
  });
});

describe('matchSets — quads against exhaustive search', () => {
  it('on 150 seeded instances of 4–12 parts (components ≤ 16: exact), the same number of quads and least total mismatch', () => {
    const rng = mulberry32(44);
    for (let t = 0; t < 150; t++) {
      const parts = randomParts(rng, 4 + Math.floor(rng() * 9), 'NPN');
      const o: MatchOptions = { hfeTolerancePct: 3 + rng() * 20, vbeToleranceMv: 1 + rng() * 6, setSize: 4, mode: 'same' };
      const r = matchSets(parts, o);
      expectValid(parts, o, r);
      const best = bruteForce(parts, o);
      expect(r.sets).toHaveLength(best.sets);
      expect(Math.abs(total(r) - best.total)).toBeLessThan(1e-6);
      expect(r.optimal).toBe(true);
      expect(r.upperBound).toBeUndefined();
    }
  });

  it('for a component above 16 parts, uses the stated heuristic: not proven optimal, with a valid upper bound', () => {
    // 20 parts all within tolerance of each other: one component of 20 > 16. Bound
    // min(⌊ν/2⌋, ⌊r/4⌋) = min(⌊10/2⌋, ⌊20/4⌋) = 5 (derived), and 5 quads are possible.
    const parts: MatchPart[] = Array.from({ length: 20 }, (_, i) => ({ id: i, polarity: 'NPN', hfe: 200 + i * 0.1, vbeMv: 650 }));
    const r = matchSets(parts, { hfeTolerancePct: 5, vbeToleranceMv: 2, setSize: 4, mode: 'same' });
    expect(r.optimal).toBe(false);
    expect(r.upperBound).toBe(5);
    expect(r.sets).toHaveLength(5);
    expect(r.method).toMatch(/heuristic/);
  });

  it('on 20 seeded larger instances (40–120 parts), the heuristic never exceeds its upper bound and its sets are valid', () => {
    const rng = mulberry32(45);
    for (let t = 0; t < 20; t++) {
      const n = 40 + Math.floor(rng() * 81);
      const h = normalSample(100 + t, n, 200, 30);
      const v = normalSample(200 + t, n, 650, 5);
      const parts: MatchPart[] = h.map((x, i) => ({ id: i, polarity: 'NPN', hfe: x, vbeMv: v[i]! }));
      const o: MatchOptions = { hfeTolerancePct: 10, vbeToleranceMv: 4, setSize: 4, mode: 'same' };
      const r = matchSets(parts, o);
      expectValid(parts, o, r);
      expect(r.sets.length).toBeLessThanOrEqual(r.upperBound ?? r.sets.length);
    }
  });
});

describe('matchSets — against the reference library edmonds-blossom-fixed on 200–400 parts', () => {
  /** The library's maximum-cardinality matching with integer weights 2^27 + 1 − round(mismatch·2^26). */
  function libraryPairs(parts: MatchPart[], o: MatchOptions): { sets: number; total: number } {
    const S = 2 ** 26;
    const edges: number[][] = [];
    const mis = new Map<string, number>();
    for (let i = 0; i < parts.length; i++) {
      for (let j = i + 1; j < parts.length; j++) {
        if (!compatible(parts[i]!, parts[j]!, o)) continue;
        const m = mismatchOf([parts[i]!, parts[j]!], o);
        mis.set(`${i},${j}`, m);
        edges.push([i, j, 2 * S + 1 - Math.round(m * S)]);
      }
    }
    const mate = edges.length === 0 ? [] : reference(edges, true);
    let sets = 0;
    let sum = 0;
    mate.forEach((m, v) => {
      if (m > v) {
        sets++;
        sum += mis.get(`${v},${m}`)!;
      }
    });
    return { sets, total: sum };
  }

  const cases = [
    { situation: 'same polarity, hFE 200 ± 30, Vbe 650 ± 5 mV, 5 % / 2 mV', mode: 'same' as const, t: 5, v: 2 },
    { situation: 'same polarity, wider tolerances 10 % / 3 mV', mode: 'same' as const, t: 10, v: 3 },
    { situation: 'complementary, 8 % / 3 mV', mode: 'complementary' as const, t: 8, v: 3 },
  ];
  it.each(cases)('$situation: same number of pairs and the same total mismatch', ({ mode, t, v }) => {
    const rng = mulberry32(t * 10 + v);
    for (let k = 0; k < 3; k++) {
      const n = 200 + Math.floor(rng() * 201);
      const h = normalSample(1000 + k + t, n, 200, 30);
      const vb = normalSample(2000 + k + t, n, 650, 5);
      const parts: MatchPart[] = h.map((x, i) => ({
        id: `P${i}`,
        polarity: mode === 'same' || i % 2 === 0 ? 'NPN' : 'PNP',
        hfe: x,
        vbeMv: mode === 'complementary' && i % 2 === 1 ? -vb[i]! : vb[i]!,
      }));
      const o: MatchOptions = { hfeTolerancePct: t, vbeToleranceMv: v, setSize: 2, mode };
      const r = matchSets(parts, o);
      expectValid(parts, o, r);
      const ref = libraryPairs(parts, o);
      expect(r.sets).toHaveLength(ref.sets);
      expect(Math.abs(total(r) - ref.total)).toBeLessThan(1e-6);
    }
  });

  it('on 40 seeded stocks of 150–400 parts from several lots at tight tolerances (3 % / 1 mV, 2 % / 0.5 mV): same number of pairs and total mismatch', () => {
    const rng = mulberry32(20261202);
    for (let k = 0; k < 40; k++) {
      const lots = 2 + Math.floor(rng() * 4);
      const parts: MatchPart[] = [];
      for (let l = 0; l < lots; l++) {
        const size = 50 + Math.floor(rng() * 70);
        const h = normalSample(5000 + 10 * k + l, size, 150 + rng() * 100, 15 + rng() * 20);
        const vb = normalSample(6000 + 10 * k + l, size, 648 + rng() * 12, 3 + rng() * 3);
        h.forEach((x, i) => parts.push({ id: `S${k}-${l}-${i}`, polarity: 'NPN', hfe: Math.round(Math.max(20, x) * 10) / 10, vbeMv: Math.round(vb[i]! * 10) / 10 }));
      }
      const o: MatchOptions = k % 2 === 0 ? { hfeTolerancePct: 3, vbeToleranceMv: 1, setSize: 2, mode: 'same' } : { hfeTolerancePct: 2, vbeToleranceMv: 0.5, setSize: 2, mode: 'same' };
      const r = matchSets(parts, o);
      expectValid(parts, o, r);
      const ref = libraryPairs(parts, o);
      expect(r.sets, `stock ${k}`).toHaveLength(ref.sets);
      expect(Math.abs(total(r) - ref.total), `stock ${k}`).toBeLessThan(1e-6);
    }
  });

  it('stock of 1 500 parts from five lots at 3 % / 1 mV (dense graph: odd cycles, blossoms and fetched edges): same number of pairs and total mismatch', () => {
    // Five invented lots with their own hFE and Vbe centres, as screened stock looks; the tight
    // tolerances leave the LP relaxation with odd cycles, so the blossom phase and its lazily
    // fetched edges both run.
    const lots = [
      [205, 28, 655, 5],
      [180, 22, 650, 4],
      [235, 35, 660, 6],
      [160, 20, 652, 5],
      [215, 30, 657, 5],
    ] as const;
    const parts: MatchPart[] = [];
    lots.forEach(([hm, hs, vm, vs], l) => {
      const h = normalSample(3000 + l, 300, hm, hs);
      const vb = normalSample(4000 + l, 300, vm, vs);
      h.forEach((x, i) => parts.push({ id: `L${l}-${i}`, polarity: 'NPN', hfe: Math.round(Math.max(20, x) * 10) / 10, vbeMv: Math.round(vb[i]! * 10) / 10 }));
    });
    const o: MatchOptions = { hfeTolerancePct: 3, vbeToleranceMv: 1, setSize: 2, mode: 'same' };
    const r = matchSets(parts, o);
    expectValid(parts, o, r);
    const ref = libraryPairs(parts, o);
    expect(r.sets).toHaveLength(ref.sets);
    expect(Math.abs(total(r) - ref.total)).toBeLessThan(1e-6);
  });
});

describe('matchSets — edge cases', () => {
  const pairs: MatchOptions = { hfeTolerancePct: 5, vbeToleranceMv: 2, setSize: 2, mode: 'same' };

  it('with no parts, returns no sets and nothing unmatched, optimal', () => {
    const r = matchSets([], pairs);
    expect(r).toMatchObject({ sets: [], unmatched: [], optimal: true });
  });

  it('with one part, leaves it unmatched', () => {
    const r = matchSets([{ id: 'A', polarity: 'NPN', hfe: 200, vbeMv: 650 }], pairs);
    expect(r.sets).toEqual([]);
    expect(r.unmatched).toEqual(['A']);
  });

  it('with five identical parts, makes two pairs of zero mismatch and leaves one', () => {
    const parts: MatchPart[] = ['a', 'b', 'c', 'd', 'e'].map((id) => ({ id, polarity: 'NPN', hfe: 220, vbeMv: 648.5 }));
    const r = matchSets(parts, pairs);
    expect(r.sets).toHaveLength(2);
    expect(r.unmatched).toHaveLength(1);
    for (const s of r.sets) expect(s).toMatchObject({ hfeSpreadPct: 0, vbeSpreadMv: 0, mismatch: 0 });
  });

  it('with zero tolerances, pairs only identical readings', () => {
    const parts: MatchPart[] = [
      { id: 1, polarity: 'NPN', hfe: 200, vbeMv: 650 },
      { id: 2, polarity: 'NPN', hfe: 200, vbeMv: 650.01 },
      { id: 3, polarity: 'NPN', hfe: 200.01, vbeMv: 650 },
      { id: 4, polarity: 'NPN', hfe: 200, vbeMv: 650 },
    ];
    const r = matchSets(parts, { ...pairs, hfeTolerancePct: 0, vbeToleranceMv: 0 });
    expect(r.sets.map((s) => s.partIds)).toEqual([[1, 4]]);
    expect(r.unmatched).toEqual([2, 3]);
  });

  it('where greedy nearest-neighbour pairing loses a pair, still finds both', () => {
    // hFE 100, 104, 105.5, 109 at 5 %: A–B 4 %, B–C 1.4 %, C–D 3.3 % are compatible, A–C 5.5 %
    // and A–D 9 % are not (derived from the tolerance definition).
    const parts: MatchPart[] = [
      { id: 'A', polarity: 'NPN', hfe: 100, vbeMv: 650 },
      { id: 'B', polarity: 'NPN', hfe: 104, vbeMv: 650 },
      { id: 'C', polarity: 'NPN', hfe: 105.5, vbeMv: 650 },
      { id: 'D', polarity: 'NPN', hfe: 109, vbeMv: 650 },
    ];
    // Greedy: take the closest compatible pair first, repeat.
    const left = new Set(parts.map((_, i) => i));
    let greedy = 0;
    for (;;) {
      let best: [number, number] | null = null;
      let bestSpread = Infinity;
      for (const i of left) {
        for (const j of left) {
          if (j <= i || !hfeWithinTolerance(parts[i]!.hfe, parts[j]!.hfe, 5)) continue;
          const s = hfeSpreadPct(parts[i]!.hfe, parts[j]!.hfe);
          if (s < bestSpread) [best, bestSpread] = [[i, j], s];
        }
      }
      if (!best) break;
      greedy++;
      left.delete(best[0]);
      left.delete(best[1]);
    }
    expect(greedy).toBe(1);
    const r = matchSets(parts, pairs);
    expect(r.sets.map((s) => s.partIds).sort()).toEqual([['A', 'B'], ['C', 'D']]);
  });

  it('in same mode, never pairs an NPN with a PNP even when their readings are equal', () => {
    const parts: MatchPart[] = [
      { id: 'n1', polarity: 'NPN', hfe: 200, vbeMv: 650 },
      { id: 'p1', polarity: 'PNP', hfe: 200, vbeMv: 650 },
      { id: 'n2', polarity: 'NPN', hfe: 201, vbeMv: 650.5 },
    ];
    const r = matchSets(parts, pairs);
    expect(r.sets.map((s) => s.partIds)).toEqual([['n1', 'n2']]);
    expect(r.unmatched).toEqual(['p1']);
  });

  it('in complementary mode, pairs NPN with PNP by |Vbe| and lists the NPN first', () => {
    const parts: MatchPart[] = [
      { id: 'p1', polarity: 'PNP', hfe: 180, vbeMv: -652 },
      { id: 'n1', polarity: 'NPN', hfe: 182, vbeMv: 651 },
      { id: 'n2', polarity: 'NPN', hfe: 181, vbeMv: 652.5 },
    ];
    const r = matchSets(parts, { ...pairs, mode: 'complementary' });
    expect(r.sets).toHaveLength(1);
    // n1: hFE 1.1 %, |ΔVbe| 1 mV → 0.222 + 0.5; n2: 0.56 %, 0.5 mV → 0.111 + 0.25, the better (derived).
    expect(r.sets[0]!.partIds).toEqual(['n2', 'p1']);
    expect(r.sets[0]!.vbeSpreadMv).toBeCloseTo(0.5, 12);
    expect(r.unmatched).toEqual(['n1']);
  });

  it('reports spreads by the tolerance definition and lists pair ids in ascending hFE', () => {
    const r = matchSets(
      [
        { id: 'hi', polarity: 'NPN', hfe: 210, vbeMv: 651 },
        { id: 'lo', polarity: 'NPN', hfe: 200, vbeMv: 650 },
      ],
      { ...pairs, hfeTolerancePct: 10 },
    );
    // (210 − 200)/200 = 5 %, 1 mV; mismatch 5/10 + 1/2 = 1 (derived).
    expect(r.sets).toEqual([{ partIds: ['lo', 'hi'], hfeSpreadPct: 5, vbeSpreadMv: 1, mismatch: 1 }]);
  });
});

describe('matchSets — bad input', () => {
  const ok: MatchOptions = { hfeTolerancePct: 5, vbeToleranceMv: 2, setSize: 2, mode: 'same' };
  const part: MatchPart = { id: 'A', polarity: 'NPN', hfe: 200, vbeMv: 650 };
  const cases: { situation: string; parts: unknown[]; options: unknown; field: string }[] = [
    { situation: 'a negative hFE tolerance', parts: [part], options: { ...ok, hfeTolerancePct: -1 }, field: 'hfeTolerancePct' },
    { situation: 'a NaN Vbe tolerance', parts: [part], options: { ...ok, vbeToleranceMv: Number.NaN }, field: 'vbeToleranceMv' },
    { situation: 'set size 3', parts: [part], options: { ...ok, setSize: 3 }, field: 'setSize' },
    { situation: 'an unknown mode', parts: [part], options: { ...ok, mode: 'mixed' }, field: 'mode' },
    { situation: 'complementary quads', parts: [part], options: { ...ok, setSize: 4, mode: 'complementary' }, field: 'setSize' },
    { situation: 'a duplicate id', parts: [part, { ...part }], options: ok, field: 'parts[1].id' },
    { situation: 'ids 7 and "7"', parts: [{ ...part, id: 7 }, { ...part, id: '7' }], options: ok, field: 'parts[1].id' },
    { situation: 'an empty id', parts: [{ ...part, id: '' }], options: ok, field: 'parts[0].id' },
    { situation: 'an unknown polarity', parts: [{ ...part, polarity: 'FET' }], options: ok, field: 'parts[0].polarity' },
    { situation: 'hFE 0', parts: [{ ...part, hfe: 0 }], options: ok, field: 'parts[0].hfe' },
    { situation: 'an infinite hFE', parts: [{ ...part, hfe: Infinity }], options: ok, field: 'parts[0].hfe' },
    { situation: 'a NaN Vbe', parts: [{ ...part, vbeMv: Number.NaN }], options: ok, field: 'parts[0].vbeMv' },
  ];
  it.each(cases)('with $situation, throws MatchingInputError naming $field', ({ parts, options, field }) => {
    const call = () => matchSets(parts as MatchPart[], options as MatchOptions);
    expect(call).toThrow(MatchingInputError);
    expect(call).toThrowError(expect.objectContaining({ field }));
  });
});

describe('describeMismatch', () => {
  it('for 1 mV at 25 °C gives a 3.97 % mirror error, 1 mV offset', () => {
    // reference.md §5 [derived]: exp(1/25.693) = 1.0397; offset = ΔVbe at equal currents.
    const d = describeMismatch({ hfeSpreadPct: 0, vbeSpreadMv: 1 });
    expect(d.mirrorCurrentErrorPct).toBeCloseTo(3.97, 2);
    expect(d.mirrorCurrentRatio).toBeCloseTo(1.0397, 4);
    expect(d.inputOffsetMv).toBe(1);
    expect(d.hfeRatio).toBe(1);
  });

  it('turns an 11.1 % hFE spread into the datasheet ratio 0.9 (smaller over larger)', () => {
    // reference.md §4 [published]: hFE1/hFE2 ≥ 0.9; 1/(1 + 0.1111) = 0.9 (derived).
    expect(describeMismatch({ hfeSpreadPct: (100 / 90 - 1) * 100, vbeSpreadMv: 0 }).hfeRatio).toBeCloseTo(0.9, 12);
  });

  it('for a 2 mV spread at 85 °C gives a smaller mirror error than at 25 °C', () => {
    // VT grows with T (reference.md §5), so exp(ΔVbe/VT) falls.
    expect(describeMismatch({ hfeSpreadPct: 0, vbeSpreadMv: 2 }, 85).mirrorCurrentRatio).toBeLessThan(
      describeMismatch({ hfeSpreadPct: 0, vbeSpreadMv: 2 }).mirrorCurrentRatio,
    );
  });

  it('with a negative spread, throws naming the field', () => {
    expect(() => describeMismatch({ hfeSpreadPct: 0, vbeSpreadMv: -1 })).toThrowError(expect.objectContaining({ field: 'vbeSpreadMv' }));
    expect(() => describeMismatch({ hfeSpreadPct: Number.NaN, vbeSpreadMv: 0 })).toThrow(MatchingInputError);
  });
});

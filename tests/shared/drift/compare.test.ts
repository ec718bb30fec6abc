import { describe, expect, it } from 'vitest';
import { compareLotWithHistory, DEFAULT_DRIFT_SETTINGS, DriftInputError } from '../../../shared/domain/drift/index.ts';
import { normalSample, sarleExample } from '../statistics/seeded-random.ts';

// Invented data: an accepted history of a small-signal NPN around hFE 180 (sd 18), limits 100–300.
const LIMITS = { hfeMin: 100, hfeMax: 300 };
const history = normalSample(11, 400, 180, 18);

describe('compareLotWithHistory', () => {
  it('states its default thresholds', () => {
    expect(DEFAULT_DRIFT_SETTINGS).toMatchObject({ ksPValue: 0.01, medianShiftPct: 10, outsideShare: 0.01 });
    expect(DEFAULT_DRIFT_SETTINGS.bimodality).toBeCloseTo(5 / 9, 12);
  });

  it('on a clean lot drawn from the same population raises no alert', () => {
    const lot = normalSample(12, 80, 180, 18);
    const r = compareLotWithHistory({ lot, history, historyLots: 5, limits: LIMITS });
    expect(r.flags).toEqual([]);
    expect(r.alert).toBe(false);
    expect(r.figures.ks!.pValue).toBeGreaterThan(0.01);
    expect(Math.abs(r.figures.median.shiftPct!)).toBeLessThan(10);
    expect(r.figures.bimodality!.b).toBeLessThan(5 / 9);
    expect(r.explanation).toMatch(/in line with the history/);
  });

  it('on a deliberately mixed lot (two populations, 150 and 260) raises an alert with KS, median and bimodality flags', () => {
    const lot = [...normalSample(21, 40, 150, 8), ...normalSample(22, 40, 260, 8)];
    const r = compareLotWithHistory({ lot, history, historyLots: 5, limits: LIMITS });
    expect(r.alert).toBe(true);
    expect(r.flags.map((f) => f.check)).toEqual(expect.arrayContaining(['ks', 'bimodal']));
    expect(r.figures.ks!.pValue).toBeLessThan(0.01);
    expect(r.figures.bimodality!.b).toBeGreaterThan(5 / 9);
    expect(r.explanation).toMatch(/mixed date codes/i);
    expect(r.explanation).toMatch(/not a finding/);
    expect(r.explanation).not.toMatch(/\bis counterfeit\b|\bare counterfeit\b/i);
    expect(r.suggestedChecks.join(' ')).toMatch(/AS6081/);
    expect(r.suggestedChecks.join(' ')).toMatch(/IDEA-STD-1010/);
  });

  it('on a shifted lot reports the median shift in %, in IQRs and in standard deviations', () => {
    const lot = normalSample(31, 60, 215, 18);
    const r = compareLotWithHistory({ lot, history, limits: LIMITS });
    const m = r.figures.median;
    expect(m.shift).toBeCloseTo(m.lot - m.history!, 12);
    expect(m.shiftPct).toBeGreaterThan(10);
    expect(m.shiftIqr).toBeGreaterThan(1);
    expect(m.shiftSd).toBeGreaterThan(1);
    expect(r.flags.map((f) => f.check)).toEqual(expect.arrayContaining(['median', 'ks']));
  });

  it('uses the asymptotic KS critical value 1.628·√((n+m)/(nm)) at α = 0.01 (reference.md §7)', () => {
    const lot = normalSample(41, 50, 180, 18);
    const r = compareLotWithHistory({ lot, history, limits: LIMITS });
    expect(r.figures.ks!.criticalD).toBeCloseTo(1.628 * Math.sqrt((50 + 400) / (50 * 400)), 3);
  });

  it("reproduces Sarle's published example b ≈ 0.336 and does not flag it (reference.md §7)", () => {
    const r = compareLotWithHistory({ lot: sarleExample(), history: [], limits: { hfeMin: null, hfeMax: null } });
    expect(r.figures.bimodality!.b).toBeCloseTo(0.336, 3);
    expect(r.flags).toEqual([]);
    expect(r.figures.ks).toBeNull();
    expect(r.notes.join(' ')).toMatch(/history holds 0 readings/);
  });

  it('flags a share outside the gain group above 1 %', () => {
    const lot = [...normalSample(51, 95, 180, 15), 90, 92, 95, 310, 320];
    const r = compareLotWithHistory({ lot, history, limits: LIMITS });
    expect(r.figures.outside).toMatchObject({ count: 5, share: 0.05 });
    expect(r.flags.some((f) => f.check === 'outside')).toBe(true);
  });

  it('does not flag a single reading outside the gain group (the sampling plan judges that), even above 1 %', () => {
    const lot = [...normalSample(52, 79, 180, 15), 95];
    const r = compareLotWithHistory({ lot, history, limits: LIMITS });
    expect(r.figures.outside).toMatchObject({ count: 1, share: 1 / 80 });
    expect(r.flags.some((f) => f.check === 'outside')).toBe(false);
  });

  it('honours a changed threshold', () => {
    const lot = normalSample(61, 80, 192, 18);
    const strict = compareLotWithHistory({ lot, history, limits: LIMITS, settings: { medianShiftPct: 2 } });
    expect(strict.flags.some((f) => f.check === 'median')).toBe(true);
  });

  it('refuses a bad setting or reading, naming it', () => {
    expect(() => compareLotWithHistory({ lot: [1, 2], history: [], limits: LIMITS, settings: { ksPValue: 2 } })).toThrow(/ksPValue/);
    try {
      compareLotWithHistory({ lot: [1, Number.NaN], history: [], limits: LIMITS });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(DriftInputError);
      expect((e as DriftInputError).field).toBe('lot');
    }
  });
});

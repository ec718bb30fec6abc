import { describe, expect, it } from 'vitest';
import { c4, DriftInputError, xbarSChart, xbarSConstants } from '../../../shared/domain/drift/index.ts';

describe('c4 and the X̄–s chart constants', () => {
  // c4 for n = 2…10 as tabulated in the NIST/SEMATECH e-Handbook of Statistical Methods §6.3.2.2
  // (Shewhart X-bar and s control charts) [published].
  it.each([
    [2, 0.7979],
    [3, 0.8862],
    [4, 0.9213],
    [5, 0.94],
    [6, 0.9515],
    [7, 0.9594],
    [8, 0.965],
    [9, 0.9693],
    [10, 0.9727],
  ])('c4(%i) equals the tabulated %f', (n, expected) => {
    expect(c4(n)).toBeCloseTo(expected, 4);
  });

  // A3, B3, B4 as tabulated for X̄ and s charts (e.g. ASTM E2587 Table 1; D. C. Montgomery,
  // Introduction to Statistical Quality Control, Appendix VI) [published].
  it.each([
    [2, 2.659, 0, 3.267],
    [5, 1.427, 0, 2.089],
    [6, 1.287, 0.03, 1.97],
    [10, 0.975, 0.284, 1.716],
    [25, 0.606, 0.565, 1.435],
  ])('for n = %i: A3 %f, B3 %f, B4 %f', (n, a3, b3, b4) => {
    const k = xbarSConstants(n);
    expect(k.a3).toBeCloseTo(a3, 3);
    expect(k.b3).toBeCloseTo(b3, 3);
    expect(k.b4).toBeCloseTo(b4, 3);
  });

  it('refuses a subgroup size below 2, naming n', () => {
    expect(() => c4(1)).toThrow(DriftInputError);
  });
});

describe('xbarSChart', () => {
  it('with equal subgroup sizes draws the classical limits x̿ ± A3·s̄ and B3·s̄ … B4·s̄', () => {
    const chart = xbarSChart([
      { n: 5, mean: 10, sd: 1 },
      { n: 5, mean: 12, sd: 2 },
      { n: 5, mean: 11, sd: 3 },
    ]);
    expect(chart.method).toBe('constant-n');
    expect(chart.grandMean).toBeCloseTo(11, 12);
    expect(chart.sBar).toBeCloseTo(2, 12);
    const p = chart.points[0]!;
    expect(p.xbar.ucl).toBeCloseTo(11 + 1.427 * 2, 2);
    expect(p.xbar.lcl).toBeCloseTo(11 - 1.427 * 2, 2);
    expect(p.s.ucl).toBeCloseTo(2.089 * 2, 2);
    expect(p.s.lcl).toBe(0);
  });

  it('with varying sizes uses the pooled σ̂ and per-lot limits x̿ ± 3σ̂/√nᵢ', () => {
    const lots = [
      { n: 13, mean: 180, sd: 20 },
      { n: 50, mean: 185, sd: 22 },
      { n: 80, mean: 176, sd: 19 },
    ];
    const chart = xbarSChart(lots);
    expect(chart.method).toBe('variable-n');
    const total = 13 + 50 + 80;
    const grand = (13 * 180 + 50 * 185 + 80 * 176) / total;
    const sigma = Math.sqrt((12 * 400 + 49 * 484 + 79 * 361) / (total - 3));
    expect(chart.grandMean).toBeCloseTo(grand, 10);
    expect(chart.sBar).toBeCloseTo(sigma, 10);
    chart.points.forEach((p, i) => {
      expect(p.xbar.ucl - p.xbar.centre).toBeCloseTo((3 * sigma) / Math.sqrt(lots[i]!.n), 10);
      expect(p.s.centre).toBeCloseTo(c4(lots[i]!.n) * sigma, 10);
    });
    // The small lot has the widest limits.
    expect(chart.points[0]!.xbar.ucl).toBeGreaterThan(chart.points[2]!.xbar.ucl);
  });

  it('marks a lot whose mean lies outside its limits', () => {
    const chart = xbarSChart([
      { n: 5, mean: 100, sd: 5 },
      { n: 5, mean: 101, sd: 5 },
      { n: 5, mean: 99, sd: 5 },
      { n: 5, mean: 100, sd: 5 },
      { n: 5, mean: 130, sd: 5 },
    ]);
    expect(chart.points.map((p) => p.outsideXbar)).toEqual([false, false, false, false, true]);
  });

  it('needs two lots with at least two readings', () => {
    expect(() => xbarSChart([{ n: 5, mean: 1, sd: 1 }, { n: 1, mean: 2, sd: 0 }])).toThrow(DriftInputError);
  });
});

describe('xbarSChart with a reference set', () => {
  it('estimates the limits from the reference lots only and judges every lot by them', () => {
    const accepted = [
      { n: 5, mean: 100, sd: 4 },
      { n: 5, mean: 102, sd: 5 },
      { n: 5, mean: 98, sd: 6 },
    ];
    const all = [...accepted, { n: 5, mean: 140, sd: 30 }];
    const chart = xbarSChart(all, accepted);
    expect(chart.grandMean).toBeCloseTo(100, 12);
    expect(chart.sBar).toBeCloseTo(5, 12);
    expect(chart.subgroups).toBe(3);
    expect(chart.points).toHaveLength(4);
    expect(chart.points[3]).toMatchObject({ outsideXbar: true, outsideS: true });
  });
});

import { describe, it, expect } from 'vitest';
import { max, mean, min } from 'simple-statistics';
import { BiasInputError, biasSpread, evaluateDividerBias, type DividerStage } from '../../../shared/domain/bias/index.ts';
import { normalSample } from '../statistics/seeded-random.ts';

const stage: DividerStage = { vcc: 12, r1: 47e3, r2: 10e3, re: 1e3, rc: 4.7e3 };

describe('biasSpread', () => {
  it('summarises VB, VE, VC and IC over the parts; min, max and mean agree with simple-statistics', () => {
    const hfe = normalSample(7, 500, 200, 40).map((h) => Math.max(30, h));
    const vbe = normalSample(8, 500, 0.65, 0.01);
    const parts = hfe.map((h, i) => ({ hfe: h, vbeV: vbe[i]! }));
    const s = biasSpread(stage, parts);
    const points = parts.map((p) => evaluateDividerBias({ ...stage, ...p }));
    expect(s.n).toBe(500);
    for (const key of ['vb', 've', 'vc', 'ic'] as const) {
      const values = points.map((p) => p[key]);
      expect(s[key].min).toBe(min(values));
      expect(s[key].max).toBe(max(values));
      expect(s[key].mean).toBeCloseTo(mean(values), 12);
      expect(s[key].p05).toBeGreaterThanOrEqual(s[key].min);
      expect(s[key].p05).toBeLessThanOrEqual(s[key].p95);
      expect(s[key].p95).toBeLessThanOrEqual(s[key].max);
    }
    expect(s.saturatedShare).toBe(0);
    expect(s.cutoffShare).toBe(0);
  });

  it('takes p05/p95 by the R-7 rule: for three parts, 10 % of the way from the lowest to the middle value', () => {
    // R-7 (Hyndman & Fan 1996, definition 7): h = (n − 1)·p = 2·0.05 = 0.1 → x1 + 0.1·(x2 − x1).
    const parts = [100, 200, 300].map((h) => ({ hfe: h, vbeV: 0.65 }));
    const ic = parts.map((p) => evaluateDividerBias({ ...stage, ...p }).ic).sort((a, b) => a - b);
    const s = biasSpread(stage, parts);
    expect(s.ic.p05).toBeCloseTo(ic[0]! + 0.1 * (ic[1]! - ic[0]!), 15);
    expect(s.ic.p95).toBeCloseTo(ic[1]! + 0.9 * (ic[2]! - ic[1]!), 15);
  });

  it('with RC 8.2k, counts the share that saturate: β 40 and 50 stay active, 100 and 150 saturate', () => {
    // VCE = 12 − IC·8.2k − VE: β 40 → 1.10 V, 50 → 0.68 V, 100 → −0.27 V, 150 → −0.62 V (derived
    // from the §5 formulas); threshold 0.2 V (common practice).
    const s = biasSpread({ ...stage, rc: 8.2e3 }, [40, 50, 100, 150].map((h) => ({ hfe: h, vbeV: 0.65 })));
    expect(s.saturatedShare).toBe(0.5);
  });

  it('counts parts whose VBE exceeds VTH as cut off (R1 160k: VTH = 0.706 V)', () => {
    // 12·10/170 = 0.7059 V: VBE 0.65 V conducts, 0.72 V does not (derived).
    const s = biasSpread({ ...stage, r1: 160e3 }, [
      { hfe: 200, vbeV: 0.65 },
      { hfe: 200, vbeV: 0.72 },
    ]);
    expect(s.cutoffShare).toBe(0.5);
    expect(s.ic.min).toBe(0);
  });

  it('with no parts, or a bad part, throws BiasInputError naming the input', () => {
    expect(() => biasSpread(stage, [])).toThrowError(expect.objectContaining({ field: 'parts' }));
    expect(() => biasSpread(stage, [{ hfe: 100, vbeV: 0.65 }, { hfe: -1, vbeV: 0.65 }])).toThrowError(
      expect.objectContaining({ field: 'parts[1].hfe' }),
    );
    expect(() => biasSpread({ ...stage, r2: 0 }, [{ hfe: 100, vbeV: 0.65 }])).toThrow(BiasInputError);
  });
});

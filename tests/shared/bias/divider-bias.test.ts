import { describe, it, expect } from 'vitest';
import { BiasInputError, DEFAULT_VCE_SAT_V, evaluateDividerBias, type DividerBiasInput } from '../../../shared/domain/bias/index.ts';

// Textbook-style stage (reference.md §5 formulas; worked by hand):
// VTH = 12·10k/57k = 2.105263 V; RTH = 47k∥10k = 8.245614 kΩ;
// IB = (2.105263 − 0.65)/(8245.614 + 101·1000) = 1.455263/109245.614 = 13.3210 µA;
// IC = 100·IB = 1.332102 mA; IE = 101·IB = 1.345423 mA; VE = IE·1k = 1.345423 V;
// VB = VE + 0.65 = 1.995423 V; VC = 12 − IC·4.7k = 5.739120 V; VCE = VC − VE = 4.393697 V.
const stage: DividerBiasInput = { vcc: 12, r1: 47e3, r2: 10e3, re: 1e3, rc: 4.7e3, hfe: 100, vbeV: 0.65 };

describe('evaluateDividerBias', () => {
  it('on the worked example (12 V, 47k/10k, RE 1k, RC 4.7k, β 100, VBE 0.65 V), matches the hand calculation', () => {
    const r = evaluateDividerBias(stage);
    expect(r.state).toBe('active');
    expect(r.saturated).toBe(false);
    expect(r.vth).toBeCloseTo(2.105263, 6);
    expect(r.rth).toBeCloseTo(8245.614, 3);
    expect(r.ib).toBeCloseTo(13.3210e-6, 10);
    expect(r.ic).toBeCloseTo(1.332102e-3, 9);
    expect(r.ie).toBeCloseTo(1.345423e-3, 9);
    expect(r.ve).toBeCloseTo(1.345423, 6);
    expect(r.vb).toBeCloseTo(1.995423, 6);
    expect(r.vc).toBeCloseTo(5.73912, 5);
    expect(r.vce).toBeCloseTo(4.393697, 6);
  });

  it('keeps the base voltage IB·RTH below the unloaded divider voltage', () => {
    // reference.md §5 [derived]: VB = VTH − IB·RTH.
    const r = evaluateDividerBias(stage);
    expect(r.vth - r.vb).toBeCloseTo(r.ib * r.rth, 12);
  });

  it('as β → ∞, IB → 0, VB → VTH and IC → (VTH − VBE)/RE', () => {
    // Limit of the §5 formulas: (2.105263 − 0.65)/1k = 1.455263 mA (derived).
    const r = evaluateDividerBias({ ...stage, hfe: 1e9 });
    expect(r.ib).toBeLessThan(2e-12);
    expect(r.vb).toBeCloseTo(r.vth, 5);
    expect(r.ic).toBeCloseTo(1.455263e-3, 8);
  });

  it('with VTH below VBE (R1 200k: VTH = 0.571 V), is cut off: no currents, VC = VCC', () => {
    // 12·10/210 = 0.5714 V < 0.65 V (derived).
    const r = evaluateDividerBias({ ...stage, r1: 200e3 });
    expect(r).toMatchObject({ state: 'cutoff', ib: 0, ic: 0, ie: 0, ve: 0, vc: 12, vce: 12, saturated: false });
    expect(r.vb).toBeCloseTo(0.571429, 6);
  });

  it('with RC 10k (active VCE would be −2.67 V), reports saturation with VCE clamped to 0.2 V', () => {
    // Node equations with VCE = 0.2 V (worked by hand):
    // VE/1k = (2.105263 − 0.65 − VE)/8245.614 + (12 − 0.2 − VE)/10k
    // → VE·(0.001 + 0.000121277 + 0.0001) = 0.000176489 + 0.00118 → VE = 1.110714 V;
    // VB = 1.760714 V, VC = 1.310714 V, IB = (2.105263 − 1.760714)/8245.614 = 41.786 µA,
    // IC = (12 − 1.310714)/10k = 1.068929 mA, IE = VE/RE = 1.110714 mA (forced β ≈ 25.6 < 100).
    const r = evaluateDividerBias({ ...stage, rc: 10e3 });
    expect(r.state).toBe('saturated');
    expect(r.saturated).toBe(true);
    expect(r.vce).toBeCloseTo(DEFAULT_VCE_SAT_V, 12);
    expect(r.ve).toBeCloseTo(1.110714, 6);
    expect(r.vb).toBeCloseTo(1.760714, 6);
    expect(r.vc).toBeCloseTo(1.310714, 6);
    expect(r.ib).toBeCloseTo(41.786e-6, 9);
    expect(r.ic).toBeCloseTo(1.068929e-3, 9);
    expect(r.ie).toBeCloseTo(r.ve / 1e3, 12);
    expect(r.ic / r.ib).toBeLessThan(100);
  });

  it('uses the VCE(sat) threshold given: at 1.0 V the worked example with RC 8.2k and β 50 (VCE 0.68 V) saturates', () => {
    // β 50: IB = 1.455263/(8245.614 + 51000) = 24.563 µA, IC = 1.228161 mA,
    // VCE = 12 − 1.228161 mA·8.2k − 1.252727 V = 0.676 V (derived).
    expect(evaluateDividerBias({ ...stage, rc: 8.2e3, hfe: 50 }).state).toBe('active');
    const r = evaluateDividerBias({ ...stage, rc: 8.2e3, hfe: 50, vceSatV: 1 });
    expect(r.state).toBe('saturated');
    expect(r.vce).toBeCloseTo(1, 12);
  });

  it('with no collector resistor (RC = 0), has VC = VCC', () => {
    const r = evaluateDividerBias({ ...stage, rc: 0 });
    expect(r.vc).toBe(12);
    expect(r.vce).toBeCloseTo(12 - 1.345423, 6);
    expect(r.state).toBe('active');
  });

  it('with the emitter grounded (RE = 0), has IB = (VTH − VBE)/RTH and VE = 0', () => {
    // 1.455263/8245.614 = 176.49 µA; IC = 17.65 mA; VC = 12 − 17.65 mA·100 Ω = 10.235 V (derived).
    const r = evaluateDividerBias({ ...stage, re: 0, rc: 100 });
    expect(r.ve).toBe(0);
    expect(r.ib).toBeCloseTo(176.49e-6, 8);
    expect(r.vc).toBeCloseTo(10.2351, 4);
  });

  const bad: { situation: string; change: Partial<Record<keyof DividerBiasInput, unknown>>; field: string }[] = [
    { situation: 'VCC 0', change: { vcc: 0 }, field: 'vcc' },
    { situation: 'R1 0', change: { r1: 0 }, field: 'r1' },
    { situation: 'a negative R2', change: { r2: -10 }, field: 'r2' },
    { situation: 'a negative RE', change: { re: -1 }, field: 're' },
    { situation: 'RC NaN', change: { rc: Number.NaN }, field: 'rc' },
    { situation: 'hFE 0', change: { hfe: 0 }, field: 'hfe' },
    { situation: 'an infinite hFE', change: { hfe: Infinity }, field: 'hfe' },
    { situation: 'VBE NaN', change: { vbeV: Number.NaN }, field: 'vbeV' },
    { situation: 'a negative VCE(sat)', change: { vceSatV: -0.1 }, field: 'vceSatV' },
    { situation: 'VCC given as a string', change: { vcc: '12' }, field: 'vcc' },
  ];
  it.each(bad)('with $situation, throws BiasInputError naming $field', ({ change, field }) => {
    const call = () => evaluateDividerBias({ ...stage, ...change } as DividerBiasInput);
    expect(call).toThrow(BiasInputError);
    expect(call).toThrowError(expect.objectContaining({ field }));
  });
});

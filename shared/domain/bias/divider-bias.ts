import { BiasInputError } from './errors.ts';

/** VCE below which a small-signal silicon transistor is taken as saturated, in V (common practice). */
export const DEFAULT_VCE_SAT_V = 0.2;

/** A divider-biased common-emitter stage; resistances in Ω, voltages in V. */
export interface DividerStage {
  readonly vcc: number;
  /** Divider resistor from VCC to the base. */
  readonly r1: number;
  /** Divider resistor from the base to ground. */
  readonly r2: number;
  /** Emitter resistor (0 allowed: emitter grounded). */
  readonly re: number;
  /** Collector resistor (0 allowed: no collector resistor, VC = VCC). */
  readonly rc: number;
  /** VCE(sat) threshold in V; default DEFAULT_VCE_SAT_V. */
  readonly vceSatV?: number;
}

export interface DividerBiasInput extends DividerStage {
  /** DC current gain β = hFE of the part, dimensionless. */
  readonly hfe: number;
  /** Base–emitter voltage of the part in V (its magnitude, for a PNP part in the mirrored stage). */
  readonly vbeV: number;
}

export type BiasState = 'cutoff' | 'active' | 'saturated';

/** Operating point in SI units: V, A, Ω. */
export interface DividerBias {
  readonly state: BiasState;
  readonly vth: number;
  readonly rth: number;
  readonly ib: number;
  readonly ic: number;
  readonly ie: number;
  readonly vb: number;
  readonly ve: number;
  readonly vc: number;
  readonly vce: number;
  /** True when the active-region solution would put VCE below vceSatV; the values are then the saturated ones. */
  readonly saturated: boolean;
}

/**
 * DC operating point of a divider-biased stage (reference.md §5, any electronics textbook):
 * VTH = VCC·R2/(R1+R2), RTH = R1∥R2, IB = (VTH − VBE)/(RTH + (β+1)·RE), IC = β·IB,
 * IE = (β+1)·IB, VE = IE·RE, VB = VE + VBE (= VTH − IB·RTH, the sag below the unloaded divider),
 * VC = VCC − IC·RC, VCE = VC − VE.
 * - VTH ≤ VBE: cut-off — no base current, IC = 0, VB = VTH, VE = 0, VC = VCC.
 * - Active VCE below vceSatV (default 0.2 V, common practice): saturated — IC is no longer β·IB;
 *   the values reported are those with VCE clamped to vceSatV and the same VBE, from the node
 *   equations IE = IB + IC, IB = (VTH − VB)/RTH, IC = (VCC − VC)/RC, IE = VE/RE. With RC = 0
 *   and RE = 0 nothing limits IC and VCE = VCC, so such a stage only counts as saturated when
 *   VCC itself is below vceSatV.
 * All inputs and outputs in SI units (V, A, Ω).
 */
export function evaluateDividerBias(input: DividerBiasInput): DividerBias {
  validateStage(input);
  const { hfe, vbeV } = input;
  if (typeof hfe !== 'number' || !Number.isFinite(hfe) || hfe <= 0) throw new BiasInputError('hfe', 'hfe must be a finite number > 0');
  if (typeof vbeV !== 'number' || !Number.isFinite(vbeV) || vbeV < 0) throw new BiasInputError('vbeV', 'vbeV must be a finite number ≥ 0 (V)');
  const { vcc, r1, r2, re, rc } = input;
  const vceSat = input.vceSatV ?? DEFAULT_VCE_SAT_V;
  const vth = (vcc * r2) / (r1 + r2);
  const rth = (r1 * r2) / (r1 + r2);

  if (vth <= vbeV) {
    return { state: 'cutoff', vth, rth, ib: 0, ic: 0, ie: 0, vb: vth, ve: 0, vc: vcc, vce: vcc, saturated: false };
  }
  const ib = (vth - vbeV) / (rth + (hfe + 1) * re);
  const ic = hfe * ib;
  const ie = (hfe + 1) * ib;
  const ve = ie * re;
  const vb = ve + vbeV;
  const vc = vcc - ic * rc;
  const vce = vc - ve;
  if (vce >= vceSat) return { state: 'active', vth, rth, ib, ic, ie, vb, ve, vc, vce, saturated: false };

  if (rc === 0 && re === 0) {
    return { state: 'saturated', vth, rth, ib, ic, ie, vb, ve, vc, vce, saturated: true };
  }
  let sVe: number;
  if (re === 0) {
    sVe = 0;
  } else if (rc === 0) {
    sVe = vcc - vceSat;
  } else {
    // IE = IB + IC with every current written in VE: VE/RE = (VTH − VBE − VE)/RTH + (VCC − VCEsat − VE)/RC.
    sVe = ((vth - vbeV) / rth + (vcc - vceSat) / rc) / (1 / re + 1 / rth + 1 / rc);
  }
  const sVb = sVe + vbeV;
  const sVc = rc === 0 ? vcc : sVe + vceSat;
  const sIb = (vth - sVb) / rth;
  const sIc = rc === 0 ? sVe / re - sIb : (vcc - sVc) / rc;
  return {
    state: 'saturated',
    vth,
    rth,
    ib: sIb,
    ic: sIc,
    ie: sIb + sIc,
    vb: sVb,
    ve: sVe,
    vc: sVc,
    vce: sVc - sVe,
    saturated: true,
  };
}

/** Throws BiasInputError naming the first bad stage value. */
export function validateStage(stage: DividerStage): void {
  if (typeof stage !== 'object' || stage === null) throw new BiasInputError('stage', 'stage values are required');
  const positive: (keyof DividerStage)[] = ['vcc', 'r1', 'r2'];
  for (const key of positive) {
    const v = stage[key];
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new BiasInputError(key, `${key} must be a finite number > 0`);
  }
  const nonNegative: (keyof DividerStage)[] = ['re', 'rc'];
  for (const key of nonNegative) {
    const v = stage[key];
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) throw new BiasInputError(key, `${key} must be a finite number ≥ 0`);
  }
  const sat = stage.vceSatV;
  if (sat !== undefined && (typeof sat !== 'number' || !Number.isFinite(sat) || sat < 0)) {
    throw new BiasInputError('vceSatV', 'vceSatV must be a finite number ≥ 0 (V)');
  }
}

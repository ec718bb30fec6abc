import { describe } from '../statistics/index.ts';
import { type DividerStage, evaluateDividerBias, validateStage } from './divider-bias.ts';
import { BiasInputError } from './errors.ts';

/** Distribution summary of one quantity over the parts; p05/p95 by the R-7 rule (statistics.percentile). */
export interface SpreadSummary {
  readonly min: number;
  readonly max: number;
  readonly mean: number;
  readonly p05: number;
  readonly p95: number;
}

export interface BiasSpread {
  readonly n: number;
  /** Base, emitter and collector voltages in V; collector current in A. */
  readonly vb: SpreadSummary;
  readonly ve: SpreadSummary;
  readonly vc: SpreadSummary;
  readonly ic: SpreadSummary;
  /** Share of the parts (0…1) that would saturate in this stage. */
  readonly saturatedShare: number;
  /** Share of the parts (0…1) that would stay cut off (VTH ≤ their VBE). */
  readonly cutoffShare: number;
}

/**
 * A divider-biased stage run against every measured part (its hFE and Vbe): spread of VB, VE,
 * VC and IC over the parts and the share that saturate or stay cut off — the fit-for-use check of
 * a part type or lot (reference.md §5; operating points by evaluateDividerBias). SI units.
 */
export function biasSpread(stage: DividerStage, parts: readonly { readonly hfe: number; readonly vbeV: number }[]): BiasSpread {
  validateStage(stage);
  if (!Array.isArray(parts) || parts.length === 0) throw new BiasInputError('parts', 'parts must be a non-empty array');
  const n = parts.length;
  const vb = new Float64Array(n);
  const ve = new Float64Array(n);
  const vc = new Float64Array(n);
  const ic = new Float64Array(n);
  let saturated = 0;
  let cutoff = 0;
  parts.forEach((p, i) => {
    let point;
    try {
      point = evaluateDividerBias({ ...stage, hfe: p.hfe, vbeV: p.vbeV });
    } catch (e) {
      if (e instanceof BiasInputError) throw new BiasInputError(`parts[${i}].${e.field}`, `parts[${i}]: ${e.message}`);
      throw e;
    }
    vb[i] = point.vb;
    ve[i] = point.ve;
    vc[i] = point.vc;
    ic[i] = point.ic;
    if (point.state === 'saturated') saturated++;
    if (point.state === 'cutoff') cutoff++;
  });
  return {
    n,
    vb: summary(vb),
    ve: summary(ve),
    vc: summary(vc),
    ic: summary(ic),
    saturatedShare: saturated / n,
    cutoffShare: cutoff / n,
  };
}

function summary(values: Float64Array): SpreadSummary {
  const d = describe(values);
  return { min: d.min, max: d.max, mean: d.mean, p05: d.p05, p95: d.p95 };
}

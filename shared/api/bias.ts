/**
 * Request and response types of the fit-for-use check: a divider-biased stage (reference.md §5)
 * evaluated for one transistor, and run against a lot's or a part type's measured hFE and Vbe.
 * SI units throughout: volts, ohms, amperes.
 */
import type { Polarity } from './catalog.ts';

/** The stage: supply, divider R1 (to the supply) and R2 (to ground), emitter and collector resistors. */
export interface BiasStage {
  vcc: number;
  r1: number;
  r2: number;
  re: number;
  /** 0 when the collector goes straight to the supply. */
  rc: number;
}

/** POST /api/bias/evaluate */
export interface BiasEvaluateRequest extends BiasStage {
  hfe: number;
  /** Base-emitter voltage, V (e.g. 0.65). */
  vbeV: number;
}

export type BiasState = 'cutoff' | 'active' | 'saturated';

export interface BiasEvaluateResponse {
  state: BiasState;
  vth: number;
  rth: number;
  ib: number;
  ic: number;
  ie: number;
  vb: number;
  ve: number;
  vc: number;
  vce: number;
  /** True when VCE would fall below VCE(sat) (0.2 V); the values are then the saturated ones. */
  saturated: boolean;
}

/** POST /api/bias/fit-for-use — one of lotId or partTypeId. */
export interface FitForUseRequest {
  lotId?: number;
  partTypeId?: number;
  stage: BiasStage;
}

/** Spread of one quantity over the parts; p05/p95 by the R-7 rule. */
export interface Spread {
  min: number;
  p05: number;
  mean: number;
  p95: number;
  max: number;
}

export interface HistogramData {
  /** k + 1 ascending edges. */
  edges: number[];
  counts: number[];
}

export interface FitForUseResponse {
  source: { kind: 'lot' | 'part-type'; id: number; label: string; partNumber: string; polarity: Polarity; lots: number };
  stage: BiasStage;
  /** Parts whose current readings were used. */
  n: number;
  /** Readings behind the spread: hFE and |Vbe| (V) at 25 °C. */
  inputs: { hfe: Spread; vbeV: Spread };
  spreads: { ic: Spread; vb: Spread; ve: Spread; vc: Spread; vce: Spread };
  saturatedCount: number;
  /** saturatedCount / n, 0…1. */
  saturatedShare: number;
  cutoffCount: number;
  cutoffShare: number;
  histograms: { ic: HistogramData; vce: HistogramData };
  /** VCE below which the stage counts as saturated, V — the line drawn on the VCE histogram. */
  saturationVceV: number;
  /** The stage at the median hFE and median Vbe of the parts. */
  typical: BiasEvaluateResponse;
  /** Most parts used (the newest readings) when a part type has more. */
  limit: number;
}

/** GET /api/bias/sources — what the fit-for-use check can run against. */
export interface BiasSourcePartType {
  partTypeId: number;
  partNumber: string;
  polarity: Polarity;
  measured: number;
  lots: { lotId: number; lotCode: string; supplierLot: string | null; measured: number }[];
}

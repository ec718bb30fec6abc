import type { LotStatus } from './bench.ts';

export type SamplingMethod = 'attribute' | 'zero-acceptance' | 'variables';
export type PlanSeverity = 'normal' | 'tightened' | 'reduced';
export type SwitchingSeverityName = PlanSeverity | 'discontinued';

/** GET /api/sampling/plan?lotSize=&level=&aql=&severity= */
export interface SamplingPlanResponse {
  codeLetter: string;
  sampleSize: number;
  accept: number;
  reject: number;
  /** Master-table row used after following the arrows. */
  planLetter: string;
  hundredPercent: boolean;
  severity: PlanSeverity;
  lotSize: number;
  level: string;
  aql: number;
  source: string;
}

/** The lot and part type as the Bench needs them (limits at 25 °C, coefficients, sampling settings). */
export interface BenchLot {
  id: number;
  code: string;
  status: LotStatus;
  quantity: number;
  supplierId: number;
  supplierName: string;
  partTypeId: number;
  binSchemeId: number | null;
  supplierLot: string | null;
  dateCode: string | null;
  receivedAt: string;
}

export interface BenchPartType {
  id: number;
  partNumber: string;
  description: string;
  polarity: 'NPN' | 'PNP';
  hfeIcMa: number;
  hfeVceV: number;
  vbeIcMa: number;
  hfeMin: number | null;
  hfeMax: number | null;
  vbeMinMv: number | null;
  vbeMaxMv: number | null;
  vbeTcMvPerC: number;
  hfeTcPctPerC: number;
  esdHbmClass: string | null;
  samplingMethod: SamplingMethod;
  inspectionLevel: string;
  aql: number;
}

/** The plan that applies to one lot. */
export interface LotPlan {
  method: SamplingMethod;
  /** Severity the plan was taken at (tightened while acceptance is discontinued). */
  severity: PlanSeverity;
  sampleSize: number;
  /** Ac and Re of attribute and zero-acceptance plans; null for the variables method. */
  accept: number | null;
  reject: number | null;
  codeLetter: string | null;
  planLetter: string | null;
  /** Acceptability constant of the variables s-method; null otherwise. */
  k: number | null;
  hundredPercent: boolean;
  /** Where the plan comes from (standard and table). */
  source: string;
  /** Simplifications and cautions the user must know about this plan. */
  notes: string[];
}

/** GET /api/lots/:id/plan */
export interface LotPlanResponse {
  lot: BenchLot;
  partType: BenchPartType;
  /** Switching state of the supplier and part type. */
  switching: SwitchingView;
  plan: LotPlan | null;
  /** Why no plan could be given (e.g. an AQL the tables do not carry). */
  planError: string | null;
  /**
   * The lot's disposition is signed: `plan` is the plan it was judged by and `planSeverity` the
   * severity then, while `switching` shows where the supplier stands now.
   */
  planAsSigned: boolean;
  planSeverity: SwitchingSeverityName;
  /** Current (not superseded) measurements of the lot. */
  measured: number;
  /** Parts still to measure for the plan's sample (0 when done). */
  remaining: number;
}

export interface SwitchingView {
  supplierId: number;
  partTypeId: number;
  severity: SwitchingSeverityName;
  reason: string;
  /** Acceptance is discontinued: no lot can be accepted until corrective action is recorded. */
  acceptanceBlocked: boolean;
  recent: ('accepted' | 'rejected')[];
  consecutiveAcceptedTightened: number;
  rejectedInTightened: number;
  switchingScore: number;
  reducedApproved: boolean;
  productionSteady: boolean;
  updatedAt: string | null;
}

/** POST /api/switching/:supplierId/:partTypeId — a quality engineer records the supplier's corrective action. */
export interface CorrectiveActionRequest {
  note: string;
}

/** PATCH /api/switching/:supplierId/:partTypeId */
export interface SwitchingSettingsRequest {
  reducedApproved?: boolean;
  productionSteady?: boolean;
}

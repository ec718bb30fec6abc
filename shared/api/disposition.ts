import type { LotPlan, SwitchingSeverityName } from './sampling.ts';

export const DISPOSITION_DECISIONS = ['accept', 'reject', 'mrb'] as const;
export type DispositionDecision = (typeof DISPOSITION_DECISIONS)[number];

export const MRB_ACTIONS = ['use-as-is', 'return-to-supplier', 'scrap', 'screen-100'] as const;
export type MrbAction = (typeof MRB_ACTIONS)[number];

export const MRB_ACTION_LABELS: Record<MrbAction, string> = {
  'use-as-is': 'Use as is',
  'return-to-supplier': 'Return to supplier',
  scrap: 'Scrap',
  'screen-100': '100 % screen',
};

/** What the product recommends from the plan and the measurements. A person decides. */
export interface Recommendation {
  decision: 'accept' | 'reject' | 'incomplete' | 'blocked';
  /** One sentence saying why. */
  reason: string;
  measured: number;
  /** Nonconforming parts (outside a limit at 25 °C); null for the variables method. */
  defects: number | null;
  plan: LotPlan | null;
  severity: SwitchingSeverityName;
  /** s-method figures when the variables method applies. */
  sMethod: { mean: number; sd: number; qL: number | null; qU: number | null; k: number; reasons: string[] } | null;
}

export interface SignedBy {
  id: number;
  name: string;
  at: string;
}

/** GET /api/lots/:id/disposition */
export interface DispositionView {
  lotId: number;
  lotStatus: string;
  /** Live recommendation from the current measurements. */
  recommendation: Recommendation;
  proposal: {
    decision: DispositionDecision;
    mrbAction: MrbAction | null;
    reason: string;
    by: SignedBy;
    /** The recommendation as it stood when proposed. */
    recommendation: Recommendation;
  } | null;
  signature: { decision: DispositionDecision; mrbAction: MrbAction | null; reason: string; by: SignedBy } | null;
  locked: boolean;
}

/** POST /api/lots/:id/disposition (inspector or quality engineer) */
export interface ProposeDispositionRequest {
  decision: DispositionDecision;
  mrbAction?: MrbAction | null;
  reason: string;
}

/** POST /api/lots/:id/disposition/sign (quality engineer) */
export interface SignDispositionRequest {
  decision: DispositionDecision;
  mrbAction?: MrbAction | null;
  reason: string;
}

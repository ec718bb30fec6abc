/**
 * Request and response types of the Suppliers area: scorecards, drift alerts, nonconformance
 * reports (NCRs) and order-quantity planning. Server DTOs implement the request types.
 */
import type { DriftFigures, DriftFlag } from '../domain/drift/index.ts';
import type { SwitchingSeverityName } from './sampling.ts';

export type { DriftFigures, DriftFlag };

/** Severity order for "the worst of several": discontinued is the most severe. */
export const SEVERITY_RANK: Record<SwitchingSeverityName, number> = { reduced: 0, normal: 1, tightened: 2, discontinued: 3 };

/** The figures of a scorecard row (one supplier, or one supplier × part type) over a period. */
export interface ScorecardFigures {
  /** Lots received in the period. */
  lotsReceived: number;
  accepted: number;
  rejected: number;
  /** Lots sent to the material review board. */
  mrb: number;
  /** Lots received in the period that are not disposed yet. */
  pending: number;
  /** accepted / (accepted + rejected + mrb); null when nothing is disposed. */
  acceptanceRate: number | null;
  /** Parts measured in sample sessions of disposed lots. */
  sampledParts: number;
  /** Of those, readings outside a part limit at 25 °C. */
  sampledDefects: number;
  /** sampledDefects / sampledParts · 10⁶; null without sampled parts. */
  dppm: number | null;
  /** Lots whose certificate of conformance was uploaded within 24 h of receipt. */
  cocOnTime: number;
  /** cocOnTime / lotsReceived; null without lots. */
  cocOnTimeRate: number | null;
  /** Mean of the lot mean hFE (sample readings at 25 °C) and the sd of those lot means. */
  meanHfe: number | null;
  sdOfLotMeans: number | null;
  /** Current ISO 2859-1 switching severity (the worst across part types for a supplier row). */
  severity: SwitchingSeverityName;
  openAlerts: number;
  openNcrs: number;
}

export interface ScorecardRow extends ScorecardFigures {
  supplierId: number;
  supplierCode: string;
  supplierName: string;
  approval: string;
  partTypes: number;
}

export const SCORECARD_SORTS = ['supplierName', 'lotsReceived', 'acceptanceRate', 'dppm', 'cocOnTimeRate', 'openAlerts'] as const;
export type ScorecardSort = (typeof SCORECARD_SORTS)[number];

export interface ScorecardPeriod {
  /** YYYY-MM-DD, inclusive. */
  from: string;
  /** YYYY-MM-DD, inclusive. */
  to: string;
}

/** GET /api/scorecards */
export interface ScorecardPage {
  items: ScorecardRow[];
  total: number;
  page: number;
  pageSize: number;
  period: ScorecardPeriod;
}

export interface ScorecardLot {
  lotId: number;
  code: string;
  receivedAt: string;
  status: string;
  dateCode: string | null;
  /** Sample readings (current, at 25 °C). */
  n: number;
  mean: number | null;
  sd: number | null;
  defects: number;
  cocOnTime: boolean;
  alertId: number | null;
}

export interface ControlPoint {
  lotId: number;
  code: string;
  receivedAt: string;
  n: number;
  mean: number;
  sd: number;
  xbar: { lcl: number; centre: number; ucl: number };
  s: { lcl: number; centre: number; ucl: number };
  outsideXbar: boolean;
  outsideS: boolean;
  accepted: boolean;
}

export interface PartScorecard {
  partType: { id: number; partNumber: string; description: string; polarity: string; hfeMin: number | null; hfeMax: number | null };
  figures: ScorecardFigures;
  severityReason: string | null;
  lots: ScorecardLot[];
  /** X̄ and s chart: limits from the accepted lots of the period; null with fewer than two. */
  chart: { method: 'constant-n' | 'variable-n'; grandMean: number; sBar: number; referenceLots: number; points: ControlPoint[] } | null;
  /** Lot acceptance per month of receipt. */
  acceptance: { month: string; disposed: number; accepted: number; rate: number | null }[];
  /** hFE distributions of the last disposed lots on common class edges, as % of each lot's readings. */
  distributions: { edges: number[]; lots: { lotId: number; code: string; receivedAt: string; n: number; percent: number[] }[] } | null;
}

/** GET /api/scorecards/:supplierId */
export interface SupplierScorecard {
  supplier: { id: number; code: string; name: string; approval: string };
  period: ScorecardPeriod;
  totals: ScorecardFigures;
  parts: PartScorecard[];
}

// --- drift alerts ----------------------------------------------------------------------------

export const ALERT_STATUSES = ['open', 'acknowledged'] as const;
export type AlertStatus = (typeof ALERT_STATUSES)[number];

export interface DriftAlertRow {
  id: number;
  lot: { id: number; code: string; status: string; dateCode: string | null; receivedAt: string };
  supplier: { id: number; code: string; name: string };
  partType: { id: number; partNumber: string };
  figures: DriftFigures;
  flags: DriftFlag[];
  explanation: string;
  suggestedChecks: string[];
  status: AlertStatus;
  raisedAt: string;
  acknowledged: { by: string; at: string; note: string } | null;
  /** NCRs raised from this alert or its lot. */
  ncrs: { id: number; code: string; status: NcrStatus }[];
}

/** POST /api/drift-alerts/:id/acknowledge */
export interface AcknowledgeAlertRequest {
  note: string;
}

// --- NCRs ------------------------------------------------------------------------------------

export const NCR_STATUSES = ['open', 'sent', 'answered', 'closed'] as const;
export type NcrStatus = (typeof NCR_STATUSES)[number];

export const NCR_STATUS_LABELS: Record<NcrStatus, string> = { open: 'Open', sent: 'Sent', answered: 'Answered', closed: 'Closed' };

export const NCR_SORTS = ['code', 'createdAt', 'dueDate', 'status', 'supplierName'] as const;
export type NcrSort = (typeof NCR_SORTS)[number];

export interface NcrRow {
  id: number;
  code: string;
  status: NcrStatus;
  lot: { id: number; code: string; status: string };
  supplier: { id: number; code: string; name: string };
  partType: { id: number; partNumber: string };
  alertId: number | null;
  dueDate: string;
  overdue: boolean;
  createdAt: string;
  sentAt: string | null;
}

export interface NcrDetail extends NcrRow {
  findings: string;
  disposition: string;
  correctiveAction: string;
  createdBy: string;
  sentTo: string | null;
  /** The outgoing message of the last send, as the outbox shows it. */
  mail: { id: number; status: 'queued' | 'sent' | 'failed'; attempts: number; lastError: string | null; sentAt: string | null } | null;
  /** Where the report would go now: the quality contact, else the first contact; null = none. */
  recipient: { name: string; email: string; duty: string | null } | null;
  answer: {
    text: string;
    document: { name: string; mediaType: string; size: number; url: string };
    by: string;
    at: string;
  } | null;
  closed: { by: string; at: string; note: string | null } | null;
  pdfUrl: string;
}

/** GET /api/ncrs/draft?lotId=&alertId= — what the create form starts with. */
export interface NcrDraft {
  lotId: number;
  alertId: number | null;
  lotCode: string;
  supplierName: string;
  partNumber: string;
  findings: string;
  disposition: string;
  /** Suggested due date, 30 days ahead (YYYY-MM-DD). */
  dueDate: string;
  /** An NCR of this lot that is not closed yet, if any (a second one is refused). */
  existing: { id: number; code: string } | null;
}

/** POST /api/ncrs */
export interface CreateNcrRequest {
  lotId: number;
  alertId?: number | null;
  /** Left out: filled from the lot's figures. */
  findings?: string;
  /** Left out: the lot's signed disposition in words. */
  disposition?: string;
  correctiveAction: string;
  /** YYYY-MM-DD, today or later. */
  dueDate: string;
}

/** PATCH /api/ncrs/:id — only while open (not sent yet). */
export interface UpdateNcrRequest {
  findings?: string;
  disposition?: string;
  correctiveAction?: string;
  dueDate?: string;
}

/** POST /api/ncrs/:id/close */
export interface CloseNcrRequest {
  note?: string | null;
}

/** Accepted answer documents (type read from the content). */
export const NCR_ANSWER_ACCEPTED = 'PDF, PNG or JPEG';
export const NCR_ANSWER_MAX_BYTES = 20 * 1024 * 1024;

// --- order-quantity planning -----------------------------------------------------------------

/** POST /api/order-plans */
export interface OrderPlanRequest {
  supplierId: number;
  partTypeId: number;
  setsWanted: number;
  setSize: 2 | 4;
  hfeTolerancePct: number;
  vbeToleranceMv: number;
  /** Percent, 50–99.9. */
  confidencePct: number;
  /** Simulated lots, default 200. */
  simulations?: number;
  /** Seed of the simulation; the same seed gives the same answer. Default 1. */
  seed?: number;
}

export interface OrderPlanJob {
  id: string;
  status: 'running' | 'done' | 'failed';
  progress: { phase: 'simulating' | 'leftovers'; done: number; total: number };
  startedAt: string;
  finishedAt: string | null;
  elapsedMs: number;
  request: OrderPlanRequest;
  /** What the simulation drew from. */
  history: { parts: number; lots: number } | null;
  error: string | null;
  result: {
    quantity: number | null;
    probability: number | null;
    confidence: number;
    setsWanted: number;
    curve: { quantity: number; probability: number }[];
    unreachable: number;
    simulations: number;
    maxQuantity: number;
    thresholds: { min: number; median: number; max: number } | null;
    expectedSets: number | null;
    leftovers: { code: string | null; label: string; expected: number }[];
    bandwidth: { hfe: number; vbeMv: number };
    matcherCalls: number;
  } | null;
}

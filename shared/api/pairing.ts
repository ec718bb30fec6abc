/**
 * Request and response types of Pairing: the loose-parts preview, kit planning, reservation,
 * pick list and pull by scan. Server DTOs implement the request types; services return the
 * response types. Readings are at 25 °C; hFE is dimensionless, Vbe in mV.
 */
import type { Polarity } from './catalog.ts';
import type { Page } from './page.ts';

export const MATCH_MODES = ['same', 'complementary'] as const;
export type MatchMode = (typeof MATCH_MODES)[number];

export const MATCH_MODE_LABELS: Record<MatchMode, string> = {
  same: 'Same polarity — diff pairs, mirrors',
  complementary: 'Complementary NPN + PNP — push-pull',
};

export const SET_SIZES = [2, 4] as const;
export type SetSize = (typeof SET_SIZES)[number];

/** The hFE tolerance as the product states it everywhere. */
export const HFE_TOLERANCE_DEFINITION = '|h1 − h2| / min(h1, h2) ≤ t';

/** What a set's mismatch means in a circuit (reference.md §5). */
export interface MismatchMeaning {
  /** Current-mirror ratio IC1/IC2 = exp(ΔVbe/VT) at equal saturation currents, ≥ 1. */
  mirrorRatio: number;
  /** The same ratio as a percentage error: (ratio − 1) · 100. */
  mirrorErrorPct: number;
  /** Differential-pair input offset at equal currents: the Vbe mismatch, mV. */
  offsetMv: number;
  /** hFE ratio smaller / larger of the set (matched-pair datasheets state e.g. ≥ 0.9). */
  hfeRatio: number;
  /** Thermal voltage used, mV (25 °C). */
  vtMv: number;
}

/** One part measured by hand for the preview. `id` is echoed back as sent. */
export interface PreviewPart {
  id: string | number;
  polarity: Polarity;
  hfe: number;
  vbeMv: number;
}

/** POST /api/pairing/preview */
export interface PairingPreviewRequest {
  parts: PreviewPart[];
  hfeTolerancePct: number;
  vbeToleranceMv: number;
  setSize: SetSize;
  mode: MatchMode;
}

export interface PreviewSet {
  partIds: (string | number)[];
  /** (max − min)/min · 100 over the set's hFE readings. */
  hfeSpreadPct: number;
  /** max − min over the set's Vbe readings (|Vbe| when complementary), mV. */
  vbeSpreadMv: number;
  /** Dimensionless: hFE spread / t + Vbe spread / v, each term at most 1. */
  mismatch: number;
  meaning: MismatchMeaning;
}

export interface PairingPreviewResponse {
  sets: PreviewSet[];
  unmatched: (string | number)[];
  /** How the sets were found (exact method or the stated heuristic). */
  method: string;
  /** True when the number of sets is proven the largest possible. */
  optimal: boolean;
  /** For a heuristic: the most sets any plan could make, so the gap is visible; null when exact. */
  upperBound: number | null;
}

// ——— Kits ———

export const KIT_STATUSES = ['planned', 'reserved', 'picking', 'pulled', 'expired', 'cancelled'] as const;
export type KitStatus = (typeof KIT_STATUSES)[number];

export const KIT_STATUS_LABELS: Record<KitStatus, string> = {
  planned: 'Planned',
  reserved: 'Reserved',
  picking: 'Picking',
  pulled: 'Pulled',
  expired: 'Expired',
  cancelled: 'Cancelled',
};

/** A kit's parts are held (reserved or being picked) in these states. */
export const KIT_OPEN_STATUSES: readonly KitStatus[] = ['reserved', 'picking'];

/** What to match: POST /api/kits/plan, and the base of POST /api/kits. */
export interface KitPlanRequest {
  /** The part type; for a complementary kit, either of the two. */
  partTypeId: number;
  /** The complementary part type (opposite polarity); only with mode 'complementary'. */
  complementPartTypeId?: number;
  mode: MatchMode;
  setSize: SetSize;
  setsWanted: number;
  /** Defaults: the part type's matching tolerance (the tighter of the two when complementary). */
  hfeTolerancePct?: number;
  vbeToleranceMv?: number;
}

/** POST /api/kits — re-plans and reserves in one transaction. */
export interface CreateKitRequest extends KitPlanRequest {
  /** How long the reservation holds, minutes (15 min to 7 days; default 240). */
  holdMinutes?: number;
  note?: string;
}

export interface KitPartTypeInfo {
  id: number;
  partNumber: string;
  description: string;
  polarity: Polarity;
  matchHfePct: number;
  matchVbeMv: number;
  esdHbmClass: string | null;
}

/** One part of a planned or reserved kit, with where it is and where it came from. */
export interface KitPartLine {
  setIndex: number;
  containerId: number;
  containerCode: string;
  position: number;
  location: string;
  measurementId: string;
  lotId: number;
  lotCode: string;
  supplierLot: string | null;
  supplierName: string;
  partTypeId: number;
  partNumber: string;
  polarity: Polarity;
  hfe25: number;
  vbeMv25: number;
  binCode: string | null;
  /** ISO time, null until pulled (always null in a plan). */
  pulledAt: string | null;
  pulledByName: string | null;
  /** ISO time the reservation of this part was given back (kit cancelled or expired); null otherwise. */
  releasedAt: string | null;
}

export interface KitSetView {
  /** 1-based. */
  index: number;
  hfeSpreadPct: number;
  vbeSpreadMv: number;
  mismatch: number;
  meaning: MismatchMeaning;
  /** The set's parts, NPN first when complementary (released ones included, marked). */
  parts: KitPartLine[];
}

/** POST /api/kits/plan — nothing is reserved. */
export interface KitPlan {
  partTypes: KitPartTypeInfo[];
  mode: MatchMode;
  setSize: SetSize;
  hfeTolerancePct: number;
  vbeToleranceMv: number;
  setsWanted: number;
  /** The most sets the whole stock on hand can make at these tolerances. */
  setsPossible: number;
  /** min(setsWanted, setsPossible): the sets this plan would reserve. */
  setsPlanned: number;
  /** Parts in stock (in positioned containers, not reserved) that were considered. */
  stockParts: number;
  method: string;
  optimal: boolean;
  upperBound: number | null;
  /** The setsPlanned sets with the smallest mismatch. */
  sets: KitSetView[];
  /** Every planned part in pick-list order (storage location, container, position). */
  pickList: KitPartLine[];
  /** Distinct containers to open. */
  containers: number;
}

export interface KitSourceLot {
  lotId: number;
  lotCode: string;
  supplierLot: string | null;
  supplierName: string;
  partNumber: string;
  parts: number;
}

export interface KitRow {
  id: number;
  code: string;
  status: KitStatus;
  mode: MatchMode;
  setSize: SetSize;
  setsWanted: number;
  partNumbers: string[];
  parts: number;
  pulled: number;
  hfeTolerancePct: number;
  vbeToleranceMv: number;
  /** ISO time the reservation ends (null once pulled, cancelled or expired). */
  reservedUntil: string | null;
  createdAt: string;
  createdByName: string;
}

export interface KitDetail extends KitRow {
  partTypes: KitPartTypeInfo[];
  note: string | null;
  sets: KitSetView[];
  /** Every part the kit holds or held (not the released ones) in pick-list order. */
  pickList: KitPartLine[];
  sourceLots: KitSourceLot[];
  completedAt: string | null;
  cancelledAt: string | null;
  cancelledByName: string | null;
  expiredAt: string | null;
  /** Parts given back to stock when the kit was cancelled or expired. */
  released: number;
}

export const KIT_SORTS = ['createdAt', 'code', 'status', 'reservedUntil'] as const;
export type KitSort = (typeof KIT_SORTS)[number];

/** Query of GET /api/kits */
export interface KitFilters {
  page?: number;
  pageSize?: number;
  status?: KitStatus;
  /** Kit code or part number contains. */
  search?: string;
  sort?: KitSort;
  dir?: 'asc' | 'desc';
}

export type KitPage = Page<KitRow>;

/** POST /api/kits/:id/pull — one scan at the pick list. */
export interface PullKitPartRequest {
  containerCode: string;
  position: number;
}

export interface PullKitPartResponse {
  kit: KitDetail;
  pulled: KitPartLine;
  /** "7 of 12 pulled" */
  progress: string;
}

/** POST /api/kits/:id/cancel */
export interface CancelKitRequest {
  reason?: string;
}

/**
 * GET /api/lots/:id/kits — which kits hold parts of the lot (reserved or pulled; parts given back
 * to stock by a cancel or an expiry are not counted), newest kit first.
 */
export interface LotKitRow {
  kitId: number;
  code: string;
  status: KitStatus;
  /** Parts of this lot in the kit, and how many of them are pulled. */
  parts: number;
  pulled: number;
  /** When the first and the last part of this lot were pulled into the kit; null before any pull. */
  firstPulledAt: string | null;
  lastPulledAt: string | null;
  createdAt: string;
  createdByName: string;
}

/** GET /api/pairing/stock — part types with measured parts in positioned containers. */
export interface PairingStockRow extends KitPartTypeInfo {
  inStock: number;
  reserved: number;
  containers: number;
}

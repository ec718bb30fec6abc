import type { LabelElement } from '../domain/labels/index.ts';

export type ApprovalStatus = 'approved' | 'conditional' | 'not-approved';

export const LOT_STATUSES = ['received', 'inspecting', 'awaiting-signature', 'accepted', 'rejected', 'mrb'] as const;
export type LotStatus = (typeof LOT_STATUSES)[number];
export const LOT_STATUS_LABELS: Record<LotStatus, string> = {
  received: 'Received',
  inspecting: 'Inspecting',
  'awaiting-signature': 'Awaiting signature',
  accepted: 'Accepted',
  rejected: 'Rejected',
  mrb: 'MRB',
};

export const DRY_BAG_STATES = ['sealed', 'opened', 'not-applicable'] as const;
export type DryBagState = (typeof DRY_BAG_STATES)[number];
export const DRY_BAG_LABELS: Record<DryBagState, string> = {
  sealed: 'Sealed dry bag',
  opened: 'Dry bag opened',
  'not-applicable': 'No dry bag',
};

/** J-STD-020 levels as stored on a lot, plus "not classified". */
export const LOT_MSL_VALUES = ['1', '2', '2a', '3', '4', '5', '5a', '6', 'not-classified'] as const;

export const DOCUMENT_KINDS = ['coc', 'photo', 'test-report', 'other'] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];
export const DOCUMENT_KIND_LABELS: Record<DocumentKind, string> = {
  coc: 'Certificate of conformance',
  photo: 'Photo',
  'test-report': 'Test report',
  other: 'Other',
};
/** Largest document accepted, bytes. */
export const DOCUMENT_MAX_BYTES = 20 * 1024 * 1024;
/** What the server accepts, decided from the content: PDF, PNG, JPEG, CSV. */
export const DOCUMENT_ACCEPTED = 'PDF, PNG, JPEG or CSV';

/**
 * Where a lot stands on its J-STD-033 floor-life clock. 'sealed': clocked level, bag not opened
 * yet; 'unknown': clocked level received without a dry bag; 'not-applicable': no clock.
 */
export type FloorLifeViewState = 'not-applicable' | 'sealed' | 'unknown' | 'ok' | 'warning' | 'expired';

export interface FloorLifeView {
  state: FloorLifeViewState;
  /** The level that applies (the lot's label, else the part type's); null when not classified. */
  msl: string | null;
  floorLifeHours: number | null;
  hoursLeft: number | null;
  expiresAt: string | null;
  bagOpenedAt: string | null;
  message: string;
}

export interface LotRow {
  id: number;
  code: string;
  status: LotStatus;
  supplier: { id: number; code: string; name: string };
  partType: { id: number; partNumber: string };
  quantity: number;
  purchaseOrder: string | null;
  supplierLot: string | null;
  dateCode: string | null;
  msl: string | null;
  dryBag: DryBagState;
  receivedAt: string;
  floorLife: FloorLifeView;
}

export interface LotDocumentRow {
  id: number;
  lotId: number;
  kind: DocumentKind;
  originalName: string;
  mediaType: string;
  sizeBytes: number;
  sha256: string;
  uploadedBy: { id: number; name: string };
  uploadedAt: string;
  /** Download address (signed-in users only). */
  contentUrl: string;
}

export interface LotDetail extends Omit<LotRow, 'supplier' | 'partType'> {
  supplier: { id: number; code: string; name: string; approval: ApprovalStatus };
  partType: {
    id: number;
    partNumber: string;
    description: string;
    polarity: 'NPN' | 'PNP';
    packageName: string;
    msl: string;
    esdHbmClass: string | null;
  };
  supplierPartNumber: string | null;
  countryOfOrigin: string | null;
  bagOpenedAt: string | null;
  receivedBy: { id: number; name: string };
  override: { by: { id: number; name: string }; reason: string } | null;
  label: { raw: string; elements: LabelElement[] } | null;
  /** JS-001 HBM class of the part with its voltage range; null when the class is unknown. */
  esd: { hbmClass: string; range: string } | null;
  documents: LotDocumentRow[];
}

export interface CreateLotRequest {
  supplierId: number;
  partTypeId: number;
  quantity: number;
  purchaseOrder?: string | null;
  supplierPartNumber?: string | null;
  supplierLot?: string | null;
  dateCode?: string | null;
  countryOfOrigin?: string | null;
  msl?: string | null;
  dryBag: DryBagState;
  /** ISO 8601; only with dryBag 'opened' (default: now). */
  bagOpenedAt?: string | null;
  /** The scanned label text as the scanner typed it; the server parses it again. */
  labelText?: string | null;
  /** Receiving from a supplier that is not approved: quality engineers only. */
  override?: { reason: string } | null;
}

export interface OpenDryBagRequest {
  state: 'opened';
  openedAt?: string;
}

export interface LotFilters {
  page: number;
  pageSize: number;
  status?: LotStatus | '';
  supplierId?: number | '';
  partTypeId?: number | '';
  /** YYYY-MM-DD, inclusive (UTC days). */
  receivedFrom?: string;
  receivedTo?: string;
  search?: string;
  sort?: string;
  dir?: 'asc' | 'desc';
}

export const LOT_SORTS = ['code', 'receivedAt', 'quantity', 'status', 'supplier', 'partNumber'] as const;
export type LotSort = (typeof LOT_SORTS)[number];

/** Suppliers and part types to pick from while receiving. */
export interface ReceivingOptions {
  suppliers: { id: number; code: string; name: string; approval: ApprovalStatus }[];
  partTypes: { id: number; partNumber: string; description: string; msl: string; esdHbmClass: string | null }[];
}

/** Label stocks the traveler prints on: common label sizes and office sheets, millimetres. */
export const TRAVELER_STOCKS = [
  { id: '100x50', label: 'Label 100 × 50 mm', widthMm: 100, heightMm: 50 },
  { id: '100x150', label: 'Label 100 × 150 mm', widthMm: 100, heightMm: 150 },
  { id: '62x29', label: 'Label 62 × 29 mm', widthMm: 62, heightMm: 29 },
  { id: '57x32', label: 'Label 57 × 32 mm', widthMm: 57, heightMm: 32 },
  { id: 'a4', label: 'A4 sheet (210 × 297 mm)', widthMm: 210, heightMm: 297 },
  { id: 'letter', label: 'Letter sheet (8.5 × 11 in)', widthMm: 215.9, heightMm: 279.4 },
] as const;
export type TravelerStockId = (typeof TRAVELER_STOCKS)[number]['id'];
export const DEFAULT_TRAVELER_STOCK: TravelerStockId = '100x50';

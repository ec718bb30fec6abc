import type { BenchWork } from '../domain/inspection/index.ts';
import type { ContainerKind, ContainerStatus } from '../domain/screening/index.ts';

export type { ContainerKind, ContainerStatus } from '../domain/screening/index.ts';
export { CONTAINER_KINDS, CONTAINER_STATUSES } from '../domain/screening/index.ts';

export const CONTAINER_KIND_LABELS: Record<ContainerKind, string> = {
  bag: 'Bag',
  tube: 'Tube',
  tray: 'Tray',
  strip: 'Foam strip',
};

export const CONTAINER_STATUS_LABELS: Record<ContainerStatus, string> = {
  open: 'Open',
  full: 'Full',
  closed: 'Closed',
  empty: 'Empty',
};

/** The state of one part in a container position (Pairing reserves and pulls them). */
export const POSITION_STATES = ['in-stock', 'reserved', 'pulled', 'scrapped', 'rebinned'] as const;
export type PositionState = (typeof POSITION_STATES)[number];

export const MOVEMENT_KINDS = ['screen-in', 'move', 'adjust', 'scrap', 'pull', 'close'] as const;
export type MovementKind = (typeof MOVEMENT_KINDS)[number];

/** Text for the parts that fall in no bin; always shown with the grey of OUTSIDE_BIN_COLOUR. */
export const OUTSIDE_BINS_CODE = 'OUT';
export const OUTSIDE_BINS_LABEL = 'Outside all bins';

/** The bin a container holds, as the screen and the label show it. */
export interface ContainerBin {
  /** null: the container holds parts outside all bins. */
  code: string | null;
  label: string;
  hfeMin: number | null;
  hfeMax: number | null;
  /** Position of the bin in its scheme (0 = lowest hFE), for its colour; null outside. */
  index: number | null;
  /** True for the scheme's last bin, whose interval is closed. */
  isLast: boolean;
  schemeId: number;
  schemeVersion: number;
}

export interface ContainerRow {
  id: number;
  code: string;
  lotId: number;
  lotCode: string;
  supplierLot: string | null;
  partTypeId: number;
  partNumber: string;
  bin: ContainerBin;
  kind: ContainerKind;
  capacity: number;
  hasPositions: boolean;
  /** Parts physically in the container (in stock or reserved). */
  quantity: number;
  location: string;
  status: ContainerStatus;
  /** Rises by one with every change; send it back as `expectedVersion` to refuse a stale edit. */
  version: number;
  createdAt: string;
  createdByName: string;
  labelPrints: number;
}

export interface ContainerPositionRow {
  position: number;
  measurementId: string;
  /** Part position in the lot (the bench's numbering). */
  lotPosition: number;
  hfe25: number;
  vbeMv25: number;
  state: PositionState;
  placedAt: string;
}

export interface MovementRow {
  id: string;
  kind: MovementKind;
  quantityDelta: number;
  quantityAfter: number;
  fromLocation: string | null;
  toLocation: string | null;
  positions: number[] | null;
  reason: string | null;
  userName: string;
  at: string;
}

export interface LabelPrintRow {
  id: string;
  stock: string;
  reprint: boolean;
  quantity: number;
  printedByName: string;
  printedAt: string;
}

/** GET /api/containers/:id and /api/containers/by-code/:code */
export interface ContainerDetail extends ContainerRow {
  supplierName: string;
  /** "IC = 2 mA, VCE = 5 V" */
  testCondition: string;
  positions: ContainerPositionRow[];
  movements: MovementRow[];
  prints: LabelPrintRow[];
}

export const CONTAINER_SORTS = ['code', 'createdAt', 'quantity', 'location', 'status', 'bin'] as const;
export type ContainerSort = (typeof CONTAINER_SORTS)[number];

/** Query of GET /api/containers */
export interface ContainerFilters {
  page?: number;
  pageSize?: number;
  partTypeId?: number;
  /** A bin code, or OUTSIDE_BINS_CODE for the parts outside all bins. */
  bin?: string;
  lotId?: number;
  /** Text contained in the location. */
  location?: string;
  status?: ContainerStatus;
  /** Code, lot code or part number contains. */
  search?: string;
  sort?: ContainerSort;
  dir?: 'asc' | 'desc';
}

/** POST /api/containers/:id/move */
export interface MoveContainerRequest {
  toLocation: string;
  /** When sent, the move is refused (409) if the container changed since this version. */
  expectedVersion?: number;
}

/** POST /api/containers/:id/adjust — count-only containers. */
export interface AdjustContainerRequest {
  delta: number;
  reason: string;
  expectedVersion?: number;
}

/** POST /api/containers/:id/scrap — `quantity` (count-only) or `positions` (positioned). */
export interface ScrapContainerRequest {
  quantity?: number;
  positions?: number[];
  reason: string;
  expectedVersion?: number;
}

/** POST /api/containers/:id/close */
export interface CloseContainerRequest {
  reason?: string;
}

/** GET /api/stock?partTypeId= */
export interface StockResponse {
  partTypes: StockPartType[];
}

export interface StockPartType {
  partTypeId: number;
  partNumber: string;
  quantity: number;
  bins: StockBin[];
}

export interface StockBin {
  /** null: outside all bins. */
  code: string | null;
  label: string;
  hfeMin: number | null;
  hfeMax: number | null;
  index: number | null;
  isLast: boolean;
  quantity: number;
  containers: { containerId: number; code: string; lotCode: string; location: string; quantity: number; status: ContainerStatus }[];
}

/** How screening opens new containers for a lot. */
export interface ScreeningSetup {
  kind: ContainerKind;
  capacity: number;
  hasPositions: boolean;
  location: string;
}

export const DEFAULT_SCREENING_SETUP: ScreeningSetup = { kind: 'strip', capacity: 50, hasPositions: true, location: 'Bench' };

/** PUT /api/lots/:id/screening/setup */
export type ScreeningSetupRequest = ScreeningSetup;

/** POST /api/lots/:id/screening/place */
export interface PlaceScreenedRequest {
  /** Also place the lot's sample readings (parts measured in sample sessions). */
  includeSample?: boolean;
}

/** Where one part went. */
export interface PartPlacement {
  measurementId: string;
  lotPosition: number;
  bin: ContainerBin;
  containerId: number;
  containerCode: string;
  /** Position in the container, or null for a count-only container. */
  position: number | null;
  /** This part opened the container. */
  openedContainer: boolean;
  /** This part took the container's last place. */
  filledContainer: boolean;
  /** The part was placed by an earlier call (the call is idempotent). */
  alreadyPlaced: boolean;
}

export interface PlaceScreenedResponse {
  placed: number;
  alreadyPlaced: number;
  containersOpened: number;
  placements: PartPlacement[];
}

export interface ScreeningBinYield {
  code: string;
  label: string;
  hfeMin: number;
  hfeMax: number;
  index: number;
  isLast: boolean;
  count: number;
  pct: number;
}

/** GET /api/lots/:id/screening */
export interface LotScreening {
  lotId: number;
  lotCode: string;
  partTypeId: number;
  partNumber: string;
  scheme: { id: number; version: number; lockedAt: string | null } | null;
  /** Parts screened (current readings of screening sessions, and placed sample readings). */
  screened: number;
  placed: number;
  unplaced: number;
  bins: ScreeningBinYield[];
  outside: { count: number; pct: number };
  setup: ScreeningSetup;
  containers: ContainerRow[];
  /**
   * What the bench may still record: `open` before the disposition is signed, `screen-only` after
   * a signed MRB "100 % screen" (screening sessions only), `closed` otherwise.
   */
  benchWork: BenchWork;
}

/** Label stocks for bin labels: thermal rolls (one label per page) and sheets with a grid. */
export interface BinLabelStock {
  id: string;
  label: string;
  kind: 'roll' | 'sheet';
  pageWidthMm: number;
  pageHeightMm: number;
  labelWidthMm: number;
  labelHeightMm: number;
  columns: number;
  rows: number;
  /** Offset of the first cell from the page's top-left corner, mm. */
  marginLeftMm: number;
  marginTopMm: number;
  /** Space between cells, mm. */
  gapXMm: number;
  gapYMm: number;
}

const roll = (w: number, h: number): BinLabelStock => ({
  id: `${w}x${h}`,
  label: `Thermal roll ${w} × ${h} mm`,
  kind: 'roll',
  pageWidthMm: w,
  pageHeightMm: h,
  labelWidthMm: w,
  labelHeightMm: h,
  columns: 1,
  rows: 1,
  marginLeftMm: 0,
  marginTopMm: 0,
  gapXMm: 0,
  gapYMm: 0,
});

export const BIN_LABEL_STOCKS: readonly BinLabelStock[] = [
  roll(100, 50),
  roll(76, 51),
  roll(62, 29),
  roll(57, 32),
  {
    id: 'a4-2x7',
    label: 'A4 sheet, 2 × 7 labels of 99.1 × 38.1 mm',
    kind: 'sheet',
    pageWidthMm: 210,
    pageHeightMm: 297,
    labelWidthMm: 99.1,
    labelHeightMm: 38.1,
    columns: 2,
    rows: 7,
    marginLeftMm: 4.65,
    marginTopMm: 15.15,
    gapXMm: 2.5,
    gapYMm: 0,
  },
  {
    id: 'a4-3x8',
    label: 'A4 sheet, 3 × 8 labels of 70 × 36 mm',
    kind: 'sheet',
    pageWidthMm: 210,
    pageHeightMm: 297,
    labelWidthMm: 70,
    labelHeightMm: 36,
    columns: 3,
    rows: 8,
    marginLeftMm: 0,
    marginTopMm: 4.5,
    gapXMm: 0,
    gapYMm: 0,
  },
  {
    id: 'letter-2x5',
    label: 'Letter sheet, 2 × 5 labels of 4 × 2 in',
    kind: 'sheet',
    pageWidthMm: 215.9,
    pageHeightMm: 279.4,
    labelWidthMm: 101.6,
    labelHeightMm: 50.8,
    columns: 2,
    rows: 5,
    marginLeftMm: 4.0,
    marginTopMm: 12.7,
    gapXMm: 4.7,
    gapYMm: 0,
  },
];

export type BinLabelStockId = string;
export const DEFAULT_BIN_LABEL_STOCK = '100x50';

export function binLabelStock(id: string): BinLabelStock | undefined {
  return BIN_LABEL_STOCKS.find((s) => s.id === id);
}

/** POST /api/labels/bins.pdf */
export interface BinLabelsRequest {
  containerIds: number[];
  stock: string;
  /** First cell to use on the first sheet (1-based, row by row); 1 on rolls. */
  startPosition?: number;
}

/** A recent placement of a screened part, for the large bin display at the bench. */
export interface RecentPlacement extends PartPlacement {
  at: string;
  /** Parts in the container right after this one went in. */
  containerQuantity: number;
  containerCapacity: number;
}

/** GET /api/lots/:id/screening/recent?limit= */
export interface RecentPlacementsResponse {
  lotId: number;
  /** The lot has an open screening session. */
  screeningOpen: boolean;
  items: RecentPlacement[];
}

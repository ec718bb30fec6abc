/** Kinds of container the parts of a bin go into. */
export const CONTAINER_KINDS = ['bag', 'tube', 'tray', 'strip'] as const;
export type ContainerKind = (typeof CONTAINER_KINDS)[number];

/**
 * open: screening may still add parts; full: every place taken (or the count reached the
 * capacity); closed: set aside by a person, screening opens a new one; empty: every part left.
 */
export const CONTAINER_STATUSES = ['open', 'full', 'closed', 'empty'] as const;
export type ContainerStatus = (typeof CONTAINER_STATUSES)[number];

/** What the placement logic needs to know about one container of a lot. */
export interface ContainerState {
  /** The caller's id for the container; returned unchanged in a placement. */
  id: number | string;
  /** The bin code the container holds; null for the parts outside all bins. */
  binCode: string | null;
  /** Places (positioned containers) or parts (count-only containers), ≥ 1. */
  capacity: number;
  hasPositions: boolean;
  status: ContainerStatus;
  /** Parts in the container now. */
  quantity: number;
  /** Positions (1-based) holding a part; only read for positioned containers. */
  occupied: readonly number[];
}

/** How a container opened by screening is made. */
export interface NewContainerSpec {
  capacity: number;
  hasPositions: boolean;
}

/** Where one screened part goes. */
export interface Placement {
  /** Bin code, or null for "outside all bins". */
  bin: string | null;
  /**
   * An existing container (its id), or a container to open: `newIndex` numbers the containers
   * the plan opens, from 1, in the order they are needed.
   */
  container: { existing: true; id: number | string } | { existing: false; newIndex: number };
  /** The position the part takes (positioned containers), or null (count-only). */
  position: number | null;
  /** True when this part takes the container's last place: it is full afterwards. */
  fillsContainer: boolean;
}

export type AdjustResult =
  | { ok: true; quantity: number }
  | { ok: false; reason: 'zero' | 'not-whole' | 'below-zero' | 'over-capacity'; message: string };

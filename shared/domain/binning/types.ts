/**
 * One gain bin of a scheme. The hFE interval is half-open [hfeMin, hfeMax) except for the last
 * bin of the scheme, which is closed [hfeMin, hfeMax] so the part limit itself can be binned.
 * The optional Vbe window (mV, at the part's test condition) is closed [vbeMinMv, vbeMaxMv];
 * a null or absent end is open.
 */
export interface GainBin {
  code: string;
  label: string;
  hfeMin: number;
  hfeMax: number;
  vbeMinMv?: number | null;
  vbeMaxMv?: number | null;
  /** The engineer intends the gap between the previous bin's hfeMax and this bin's hfeMin. */
  gapBeforeIntended?: boolean;
}

/** The bins of one scheme version, in ascending hFE order. */
export type GainBinScheme = readonly GainBin[];

/** The part type's hFE limits; null means no limit on that side. */
export interface PartHfeLimits {
  hfeMin: number | null;
  hfeMax: number | null;
}

export interface BinSchemeError {
  /** Index of the offending bin, or −1 for the scheme as a whole. */
  index: number;
  /** The field of GainBin the message is about ('bins' for the scheme as a whole). */
  field: string;
  message: string;
}

export interface BinSchemeValidation {
  ok: boolean;
  errors: BinSchemeError[];
}

/** One measured part to bin; vbeMv is needed only when a bin has a Vbe window. */
export interface PartMeasurement {
  hfe: number;
  vbeMv?: number | null;
}

export interface BinCounts {
  /** One entry per bin, in scheme order. */
  counts: { code: string; count: number }[];
  /** Parts that fall in no bin. */
  outside: number;
  total: number;
}

/** A part type's limits at 25 °C; null means open on that side. hFE dimensionless, Vbe in mV. */
export interface PartLimits {
  hfeMin: number | null;
  hfeMax: number | null;
  vbeMinMv: number | null;
  vbeMaxMv: number | null;
}

export type LimitFlag = 'hfe-low' | 'hfe-high' | 'vbe-low' | 'vbe-high';

/**
 * Which limits a reading referred to 25 °C breaks. A value equal to a limit conforms (limits are
 * inclusive, as datasheets print "min" and "max"). Product rule.
 */
export function limitFlags(limits: PartLimits, hfe25: number, vbeMv25: number): LimitFlag[] {
  const flags: LimitFlag[] = [];
  if (limits.hfeMin !== null && hfe25 < limits.hfeMin) flags.push('hfe-low');
  if (limits.hfeMax !== null && hfe25 > limits.hfeMax) flags.push('hfe-high');
  if (limits.vbeMinMv !== null && vbeMv25 < limits.vbeMinMv) flags.push('vbe-low');
  if (limits.vbeMaxMv !== null && vbeMv25 > limits.vbeMaxMv) flags.push('vbe-high');
  return flags;
}

const FLAG_TEXT: Record<LimitFlag, (l: PartLimits) => string> = {
  'hfe-low': (l) => `hFE below ${l.hfeMin}`,
  'hfe-high': (l) => `hFE above ${l.hfeMax}`,
  'vbe-low': (l) => `Vbe below ${l.vbeMinMv} mV`,
  'vbe-high': (l) => `Vbe above ${l.vbeMaxMv} mV`,
};

/** The flag in words, naming the limit, e.g. "hFE below 100". */
export function describeFlag(flag: LimitFlag, limits: PartLimits): string {
  return FLAG_TEXT[flag](limits);
}

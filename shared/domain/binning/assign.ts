import { BinningInputError } from './errors.ts';
import type { BinCounts, GainBin, GainBinScheme, PartMeasurement } from './types.ts';

function inBin(bin: GainBin, isLast: boolean, part: PartMeasurement): boolean {
  const { hfe } = part;
  if (hfe < bin.hfeMin) return false;
  if (isLast ? hfe > bin.hfeMax : hfe >= bin.hfeMax) return false;
  const vMin = bin.vbeMinMv ?? null;
  const vMax = bin.vbeMaxMv ?? null;
  if (vMin === null && vMax === null) return true;
  const vbe = part.vbeMv ?? null;
  if (vbe === null) return false;
  return (vMin === null || vbe >= vMin) && (vMax === null || vbe <= vMax);
}

const partField = (index: number) => (index < 0 ? 'part' : `parts[${index}]`);

/** `index` is the part's place in a list, or −1 for a single part; the field name is built only on error. */
function checkPart(part: PartMeasurement, index: number): void {
  if (!Number.isFinite(part.hfe)) throw new BinningInputError(`${partField(index)}.hfe`, 'hfe must be a finite number');
  if (part.vbeMv != null && !Number.isFinite(part.vbeMv)) {
    throw new BinningInputError(`${partField(index)}.vbeMv`, 'vbeMv must be a finite number or empty');
  }
}

/**
 * The code of the bin a part belongs to, or null for "outside all bins". hFE intervals are
 * [hfeMin, hfeMax) and the scheme's last bin is closed [hfeMin, hfeMax]; a bin with a Vbe
 * window (mV, closed) takes the part only when its Vbe lies inside — a part without a Vbe
 * reading never enters such a bin. Expects a scheme that passes validateBinScheme, which
 * guarantees at most one match. Product rule (Binwright product brief, gain binning).
 */
export function assignBin(scheme: GainBinScheme, part: PartMeasurement): string | null {
  checkPart(part, -1);
  const last = scheme.length - 1;
  for (let i = 0; i <= last; i++) {
    const bin = scheme[i] as GainBin;
    if (inBin(bin, i === last, part)) return bin.code;
  }
  return null;
}

/**
 * How many parts fall in each bin of the scheme (in scheme order) and how many fall outside
 * all bins, by the rule of assignBin. Counts of parts, no unit.
 */
export function binCounts(scheme: GainBinScheme, parts: readonly PartMeasurement[]): BinCounts {
  // A plain indexed loop: this runs over every part of a 100 000-part lot.
  const last = scheme.length - 1;
  const tally = new Array<number>(scheme.length).fill(0);
  let outside = 0;
  for (let p = 0; p < parts.length; p++) {
    const part = parts[p] as PartMeasurement;
    checkPart(part, p);
    let i = 0;
    while (i <= last && !inBin(scheme[i] as GainBin, i === last, part)) i++;
    if (i <= last) tally[i] = (tally[i] as number) + 1;
    else outside++;
  }
  const counts = scheme.map((bin, i) => ({ code: bin.code, count: tally[i] as number }));
  return { counts, outside, total: parts.length };
}

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

function checkPart(part: PartMeasurement, field: string): void {
  if (!Number.isFinite(part.hfe)) throw new BinningInputError(`${field}.hfe`, 'hfe must be a finite number');
  if (part.vbeMv != null && !Number.isFinite(part.vbeMv)) {
    throw new BinningInputError(`${field}.vbeMv`, 'vbeMv must be a finite number or empty');
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
  checkPart(part, 'part');
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
  const counts = scheme.map((bin) => ({ code: bin.code, count: 0 }));
  const last = scheme.length - 1;
  let outside = 0;
  parts.forEach((part, p) => {
    checkPart(part, `parts[${p}]`);
    for (let i = 0; i <= last; i++) {
      if (inBin(scheme[i] as GainBin, i === last, part)) {
        (counts[i] as { count: number }).count++;
        return;
      }
    }
    outside++;
  });
  return { counts, outside, total: parts.length };
}

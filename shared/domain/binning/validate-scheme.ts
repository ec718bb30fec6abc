import type { BinSchemeError, BinSchemeValidation, GainBinScheme, PartHfeLimits } from './types.ts';

const isFiniteOrOpen = (v: number | null | undefined): boolean => v === null || v === undefined || Number.isFinite(v);

/**
 * Checks a gain-bin scheme: at least one bin; non-empty, unique codes and non-empty labels;
 * finite hfeMin < hfeMax; vbeMinMv < vbeMaxMv when both are set; bins listed in ascending hFE
 * order without overlap (intervals are [hfeMin, hfeMax), the last closed — see GainBin), so a
 * bin may start exactly where the previous one ends; a gap between neighbours only when the
 * later bin marks gapBeforeIntended; and every interval inside the part's hFE limits.
 * Returns every problem found, each naming the bin index and field. Product rule (Binwright
 * product brief, gain binning); no external standard.
 */
export function validateBinScheme(bins: GainBinScheme, partLimits: PartHfeLimits): BinSchemeValidation {
  const errors: BinSchemeError[] = [];
  const add = (index: number, field: string, message: string): void => {
    errors.push({ index, field, message });
  };
  if (bins.length === 0) {
    add(-1, 'bins', 'a scheme needs at least one bin');
    return { ok: false, errors };
  }
  const seen = new Set<string>();
  bins.forEach((bin, i) => {
    const code = bin.code.trim();
    if (code === '') add(i, 'code', 'code must not be empty');
    else if (seen.has(code)) add(i, 'code', `code "${code}" is already used by an earlier bin`);
    else seen.add(code);
    if (bin.label.trim() === '') add(i, 'label', 'label must not be empty');

    const hfeOk = Number.isFinite(bin.hfeMin) && Number.isFinite(bin.hfeMax);
    if (!Number.isFinite(bin.hfeMin)) add(i, 'hfeMin', 'hfeMin must be a finite number');
    if (!Number.isFinite(bin.hfeMax)) add(i, 'hfeMax', 'hfeMax must be a finite number');
    if (hfeOk && bin.hfeMin >= bin.hfeMax) add(i, 'hfeMax', 'hfeMax must be greater than hfeMin');

    if (!isFiniteOrOpen(bin.vbeMinMv)) add(i, 'vbeMinMv', 'vbeMinMv must be a finite number or empty');
    if (!isFiniteOrOpen(bin.vbeMaxMv)) add(i, 'vbeMaxMv', 'vbeMaxMv must be a finite number or empty');
    if (bin.vbeMinMv != null && bin.vbeMaxMv != null && bin.vbeMinMv >= bin.vbeMaxMv) {
      add(i, 'vbeMaxMv', 'vbeMaxMv must be greater than vbeMinMv');
    }

    if (partLimits.hfeMin !== null && Number.isFinite(bin.hfeMin) && bin.hfeMin < partLimits.hfeMin) {
      add(i, 'hfeMin', `hfeMin ${bin.hfeMin} is below the part's minimum hFE ${partLimits.hfeMin}`);
    }
    if (partLimits.hfeMax !== null && Number.isFinite(bin.hfeMax) && bin.hfeMax > partLimits.hfeMax) {
      add(i, 'hfeMax', `hfeMax ${bin.hfeMax} is above the part's maximum hFE ${partLimits.hfeMax}`);
    }

    if (i === 0) return;
    const prev = bins[i - 1];
    if (prev === undefined || !hfeOk || !Number.isFinite(prev.hfeMin) || !Number.isFinite(prev.hfeMax)) return;
    if (bin.hfeMin < prev.hfeMin) {
      add(i, 'hfeMin', `bins must be listed in ascending hFE order: hfeMin ${bin.hfeMin} is below the previous bin ("${prev.code}") starting at ${prev.hfeMin}`);
    } else if (bin.hfeMin < prev.hfeMax) {
      add(i, 'hfeMin', `overlaps the previous bin ("${prev.code}"), which runs to ${prev.hfeMax}`);
    } else if (bin.hfeMin > prev.hfeMax && bin.gapBeforeIntended !== true) {
      add(i, 'hfeMin', `gap from ${prev.hfeMax} to ${bin.hfeMin} after the previous bin ("${prev.code}") is not marked as intended`);
    }
  });
  return { ok: errors.length === 0, errors };
}

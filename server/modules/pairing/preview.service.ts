import type { PairingPreviewRequest, PairingPreviewResponse } from '../../../shared/api/pairing.ts';
import { MatchingInputError, matchSets, type MatchPart } from '../../../shared/domain/matching/index.ts';
import { AppError } from '../../http/app-error.ts';
import { meaningOfSet } from './set-meaning.ts';

/**
 * POST /api/pairing/preview: matched sets among loose parts an assembler measured by hand. Ids
 * come back exactly as sent (text or number); a bad input is a 400 naming the field.
 */
export function previewPairing(req: PairingPreviewRequest): PairingPreviewResponse {
  const original = new Map<string, string | number>();
  const parts: MatchPart[] = req.parts.map((p, i) => {
    const key = String(p.id);
    if (original.has(key)) throw AppError.badRequest(`Part id ${key} appears twice.`, [{ field: `parts[${i}].id`, message: 'each part id once' }]);
    original.set(key, p.id);
    return { id: key, polarity: p.polarity, hfe: p.hfe, vbeMv: p.vbeMv };
  });
  let result: ReturnType<typeof matchSets>;
  try {
    result = matchSets(parts, { hfeTolerancePct: req.hfeTolerancePct, vbeToleranceMv: req.vbeToleranceMv, setSize: req.setSize, mode: req.mode });
  } catch (e) {
    if (e instanceof MatchingInputError) throw AppError.badRequest(`Check ${e.field}: ${e.message}.`, [{ field: e.field, message: e.message }]);
    throw e;
  }
  const back = (id: string | number) => original.get(String(id)) ?? id;
  return {
    sets: result.sets.map((s) => ({
      partIds: s.partIds.map(back),
      hfeSpreadPct: s.hfeSpreadPct,
      vbeSpreadMv: s.vbeSpreadMv,
      mismatch: s.mismatch,
      meaning: meaningOfSet(s),
    })),
    unmatched: result.unmatched.map(back),
    method: result.method,
    optimal: result.optimal,
    upperBound: result.upperBound ?? null,
  };
}

import { createHash } from 'node:crypto';
import type { DataSource, EntityManager } from 'typeorm';
import { LabelFormatError, canonicalLabelText, parseLabel, type ParsedLabel } from '../../../shared/domain/labels/index.ts';
import { AppError } from '../../http/app-error.ts';
import { effectiveSubstitutes, getScannerSettings } from '../settings/settings.service.ts';

export interface ReadLabel {
  parsed: ParsedLabel;
  /** SHA-256 (hex) of the canonical label text; null for a plain code. */
  fingerprint: string | null;
}

/**
 * Parses scanned text with the site's separator substitutes plus the built-in ones. A malformed
 * ISO/IEC 15434 envelope becomes a 422 naming `field` (the request field that carried the text).
 */
export async function readLabel(m: DataSource | EntityManager, text: string, field = 'text'): Promise<ReadLabel & { purchaseOrderPattern: string | null }> {
  const settings = await getScannerSettings(m);
  let parsed: ParsedLabel;
  try {
    parsed = parseLabel(text, { substitutes: effectiveSubstitutes(settings) });
  } catch (e) {
    if (e instanceof LabelFormatError) {
      throw AppError.unprocessable(`The label could not be read: ${e.message}.`, [{ field, message: e.message }]);
    }
    throw e;
  }
  const fingerprint =
    parsed.format !== null && parsed.elements.length > 0
      ? createHash('sha256').update(canonicalLabelText(parsed.elements), 'utf8').digest('hex')
      : null;
  return { parsed, fingerprint, purchaseOrderPattern: settings.purchaseOrderPattern };
}

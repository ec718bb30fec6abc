import Papa from 'papaparse';

export type Detected =
  | { ok: true; mediaType: 'application/pdf' | 'image/png' | 'image/jpeg' | 'text/csv'; label: string }
  | { ok: false; what: string };

const startsWith = (b: Uint8Array, sig: readonly number[]) => b.length >= sig.length && sig.every((v, i) => b[i] === v);
const ascii = (s: string) => [...s].map((c) => c.charCodeAt(0));

const PDF = ascii('%PDF-');
/** PNG signature (PNG specification §5.2). */
const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
/** JPEG SOI marker followed by the first marker's 0xFF (ITU-T T.81). */
const JPEG = [0xff, 0xd8, 0xff];
const SHEBANG = ascii('#!');

/** Signatures named in a refusal (checked after CSV, so text that starts with "MZ" stays CSV). */
const KNOWN_REFUSED: { sig: number[]; what: string }[] = [
  { sig: [0x7f, 0x45, 0x4c, 0x46], what: 'an ELF executable' },
  { sig: ascii('MZ'), what: 'a Windows (PE/MZ) executable' },
  { sig: [0xcf, 0xfa, 0xed, 0xfe], what: 'a Mach-O executable' },
  { sig: [0xfe, 0xed, 0xfa, 0xcf], what: 'a Mach-O executable' },
  { sig: [0xca, 0xfe, 0xba, 0xbe], what: 'a Mach-O or Java class file' },
  { sig: [0x50, 0x4b, 0x03, 0x04], what: 'a ZIP archive (or an office document)' },
  { sig: [0x1f, 0x8b], what: 'a gzip archive' },
  { sig: ascii('GIF8'), what: 'a GIF image' },
  { sig: ascii('RIFF'), what: 'a RIFF file (WebP, WAV or AVI)' },
  { sig: [0xd0, 0xcf, 0x11, 0xe0], what: 'a legacy office document' },
];

/**
 * Decides a document's type from its bytes alone — never from its name or the type the browser
 * claims: PDF ("%PDF-"), PNG (8-byte signature), JPEG (FF D8 FF), or CSV: valid UTF-8 text
 * without NUL or other control bytes (tab, CR and LF allowed) that parses as delimited rows
 * (comma, semicolon, tab or bar): at least two rows, most of them with the same two or more columns.
 */
export function detectMediaType(bytes: Uint8Array): Detected {
  if (startsWith(bytes, PDF)) return { ok: true, mediaType: 'application/pdf', label: 'PDF' };
  if (startsWith(bytes, PNG)) return { ok: true, mediaType: 'image/png', label: 'PNG image' };
  if (startsWith(bytes, JPEG)) return { ok: true, mediaType: 'image/jpeg', label: 'JPEG image' };
  if (startsWith(bytes, SHEBANG)) return { ok: false, what: 'a script' };
  if (isCsv(bytes)) return { ok: true, mediaType: 'text/csv', label: 'CSV table' };
  const known = KNOWN_REFUSED.find((k) => startsWith(bytes, k.sig));
  return { ok: false, what: known?.what ?? 'neither PDF, PNG, JPEG nor a CSV table' };
}

function isCsv(bytes: Uint8Array): boolean {
  for (const b of bytes) {
    if (b === 0x09 || b === 0x0a || b === 0x0d) continue;
    if (b < 0x20 || b === 0x7f) return false;
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    return false;
  }
  if (text.trim() === '') return false;
  const result = Papa.parse<string[]>(text, { delimitersToGuess: [',', ';', '\t', '|'], skipEmptyLines: true });
  if (result.errors.some((e) => e.type === 'Quotes' || e.code === 'UndetectableDelimiter')) return false;
  const rows = result.data;
  // A table: a header and at least one data row.
  if (rows.length < 2) return false;
  // The most common row width must be at least two columns and cover most rows.
  const widths = new Map<number, number>();
  for (const r of rows) widths.set(r.length, (widths.get(r.length) ?? 0) + 1);
  const [width, count] = [...widths.entries()].sort((a, b) => b[1] - a[1])[0];
  return width >= 2 && count >= Math.ceil(rows.length * 0.8);
}

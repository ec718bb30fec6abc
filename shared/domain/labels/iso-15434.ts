import { normaliseMslLevel, type MslLevel } from '../moisture/msl-levels.ts';
import { isDataIdentifier, splitDataIdentifier } from './data-identifiers.ts';
import { LabelFormatError } from './errors.ts';

/** ISO/IEC 15434 separators (reference.md §3). */
export const RS = '\u001e';
export const GS = '\u001d';
export const EOT = '\u0004';
/** Message header that opens every ISO/IEC 15434 message. */
export const MESSAGE_HEADER = '[)>';
/** The one format envelope read here: ANSI MH10.8.2 data identifiers. */
export const FORMAT_06 = '06';

export interface SeparatorSubstitutes {
  gs: readonly string[];
  rs: readonly string[];
  eot: readonly string[];
}

/**
 * Text that keyboard-wedge scanners commonly send instead of GS / RS / EOT: angle and curly
 * bracket names, caret notation (GS = ^], RS = ^^, EOT = ^D) and the Unicode control pictures
 * U+241D/U+241E/U+2404 [common practice; sites configure their scanners differently].
 */
export const DEFAULT_SUBSTITUTES: SeparatorSubstitutes = {
  gs: ['<GS>', '{GS}', '^]', '\u241d'],
  rs: ['<RS>', '{RS}', '^^', '\u241e'],
  eot: ['<EOT>', '{EOT}', '^D', '\u2404'],
};

export interface ParseLabelOptions {
  /** Per separator, a list that replaces the default substitutes for that separator. */
  substitutes?: { gs?: readonly string[]; rs?: readonly string[]; eot?: readonly string[] };
}

export interface LabelElement {
  di: string;
  value: string;
}

export interface LabelFields {
  /** DI P */
  customerPartNumber: string | null;
  /** DI 1P */
  supplierPartNumber: string | null;
  /** DI Q, pieces */
  quantity: number | null;
  /** DI K */
  purchaseOrder: string | null;
  /** DI 1T */
  supplierLot: string | null;
  /** DI 10D, else 9D, else 11D, as printed */
  dateCode: string | null;
  /** DI 4L, ISO 3166 alpha-2 */
  countryOfOrigin: string | null;
  /** DI 13E, normalised J-STD-020 level */
  msl: MslLevel | null;
}

export interface ParsedLabel {
  /** '06' for an ISO/IEC 15434 message; null for plain text (a 1D code or typed text). */
  format: string | null;
  /** Every data element in order, mapped or not. */
  elements: LabelElement[];
  fields: LabelFields;
  /** Elements whose DI does not map to a field; they also stay in `elements`. */
  unknown: LabelElement[];
  warnings: string[];
  /** The text exactly as received. */
  raw: string;
  /** Trimmed text when the input is not an ISO/IEC 15434 message; null otherwise. */
  plainCode: string | null;
}

const FIELD_OF_DI: Readonly<Record<string, keyof LabelFields>> = {
  P: 'customerPartNumber',
  '1P': 'supplierPartNumber',
  Q: 'quantity',
  K: 'purchaseOrder',
  '1T': 'supplierLot',
  '10D': 'dateCode',
  '9D': 'dateCode',
  '11D': 'dateCode',
  '4L': 'countryOfOrigin',
  '13E': 'msl',
};

const DATE_CODE_PREFERENCE = ['10D', '9D', '11D'] as const;

/** Format names for clearer rejections (reference.md §3). */
const FORMAT_NAMES: Readonly<Record<string, string>> = { '05': 'GS1 application identifiers' };

/** AIM symbology identifier some scanners prefix, e.g. "]d2" for Data Matrix. */
const SYMBOLOGY_ID = /^\][A-Za-z][0-9A-Za-z]/;

/**
 * Reads a supplier label scanned from a 2D code (ISO/IEC 15434 message, format 06, ANSI MH10.8.2
 * data identifiers) into typed fields. Envelope: "[)>" RS "06" GS element GS … RS EOT.
 *
 * Decisions (each one is tested):
 * - Text that does not start with "[)>" (after leading whitespace and an optional AIM symbology
 *   identifier such as "]d2") is a plain code — a 1D barcode or typed text — and is returned with
 *   `format: null` and `plainCode`, not rejected. Empty text throws.
 * - Substitutes for GS/RS/EOT (`DEFAULT_SUBSTITUTES`, or the site's lists) are replaced by the
 *   real control characters before parsing, case-insensitively, longest first.
 * - No RS right after "[)>" throws: without separators the elements cannot be told apart.
 * - The first format envelope must be 06; any other (05 GS1 AIs, 12 …) throws, because its
 *   elements do not use MH10.8.2 DIs. Later non-06 envelopes are ignored with a warning.
 * - A missing or partial trailer (RS EOT) is accepted with a warning: scanners often drop it.
 *   Whitespace after EOT (the scanner's Enter) is ignored; other text after EOT gives a warning.
 * - Empty elements, elements without a DI and DIs without a value are skipped with a warning.
 * - A DI that repeats with a different value keeps the first value, with a warning.
 * - Q must be digits (optionally with a decimal point); otherwise LabelFormatError with
 *   field `quantity` and di `Q`.
 * - 4L is upper-cased; a value that is not two letters is kept with a warning.
 * - 13E is normalised to a J-STD-020 level; an unrecognised value gives `msl: null` and a warning.
 * - DIs without a field mapping are kept, in `elements` and in `unknown`.
 * Element values are trimmed of surrounding whitespace.
 * @throws LabelFormatError for empty text or a malformed envelope, or a non-numeric quantity.
 */
export function parseLabel(text: string, options: ParseLabelOptions = {}): ParsedLabel {
  const start = stripScannerPrefix(text);
  if (!start.startsWith(MESSAGE_HEADER)) {
    const plainCode = text.trim();
    if (plainCode === '') throw new LabelFormatError('the label text is empty');
    return { format: null, elements: [], fields: emptyFields(), unknown: [], warnings: [], raw: text, plainCode };
  }

  const warnings: string[] = [];
  let body = normaliseSeparators(start.slice(MESSAGE_HEADER.length), resolveSubstitutes(options.substitutes));
  if (!body.startsWith(RS)) {
    throw new LabelFormatError(
      'missing RS (record separator, 0x1E) after "[)>"; if the scanner cannot send control ' +
        'characters, configure it to send a substitute such as <RS> and <GS>',
    );
  }
  body = stripTrailer(body.slice(RS.length), warnings);

  const elements: LabelElement[] = [];
  body.split(RS).forEach((envelope, index) => {
    const gsAt = envelope.indexOf(GS);
    const header = gsAt === -1 ? envelope : envelope.slice(0, gsAt);
    if (index === 0) {
      requireFormat06(header);
    } else if (envelope === '') {
      warnings.push(`empty format envelope ${index + 1} skipped`);
      return;
    } else if (header !== FORMAT_06) {
      warnings.push(`format envelope ${index + 1} (format "${header}") ignored; only format 06 is read`);
      return;
    }
    if (gsAt === -1) {
      warnings.push(`format envelope ${index + 1} has no data elements`);
      return;
    }
    envelope
      .slice(gsAt + GS.length)
      .split(GS)
      .forEach((item, position) => {
        const element = readElement(item, position + 1, warnings);
        if (element) elements.push(element);
      });
  });

  const { fields, unknown } = mapFields(elements, warnings);
  return { format: FORMAT_06, elements, fields, unknown, warnings, raw: text, plainCode: null };
}

/**
 * Builds an ISO/IEC 15434 format-06 message ("[)>" RS "06" GS … RS EOT) from MH10.8.2 data
 * elements, e.g. for the Data Matrix on our own labels. The result parses back to the same
 * elements with `parseLabel`.
 * @throws LabelFormatError (field `elements[i].di` / `elements[i].value`) for an empty list, a
 * DI that is not up to three digits plus one uppercase letter, or a value that is empty, has
 * surrounding whitespace or contains a control character.
 */
export function formatLabel(elements: readonly LabelElement[]): string {
  if (elements.length === 0) throw new LabelFormatError('a label needs at least one data element', 'elements');
  const parts = elements.map((element, i) => {
    if (!isDataIdentifier(element.di)) {
      throw new LabelFormatError(`"${element.di}" is not an MH10.8.2 data identifier`, `elements[${i}].di`, element.di);
    }
    if (element.value === '' || element.value !== element.value.trim() || hasControlCharacter(element.value)) {
      throw new LabelFormatError(
        `the value of ${element.di} must be non-empty, without surrounding spaces or control characters`,
        `elements[${i}].value`,
        element.di,
      );
    }
    return element.di + element.value;
  });
  return `${MESSAGE_HEADER}${RS}${FORMAT_06}${GS}${parts.join(GS)}${RS}${EOT}`;
}

/**
 * Replaces scanner substitutes for GS, RS and EOT with the real control characters
 * (case-insensitive, longest substitute first so "<EOT>" is not read as something shorter).
 */
export function normaliseSeparators(text: string, substitutes: SeparatorSubstitutes = DEFAULT_SUBSTITUTES): string {
  const byText = new Map<string, string>();
  const add = (list: readonly string[], char: string) => {
    for (const s of list) if (!byText.has(s.toLowerCase())) byText.set(s.toLowerCase(), char);
  };
  add(substitutes.gs, GS);
  add(substitutes.rs, RS);
  add(substitutes.eot, EOT);
  if (byText.size === 0) return text;
  const alternatives = [...byText.keys()].sort((a, b) => b.length - a.length).map(escapeRegExp);
  const pattern = new RegExp(alternatives.join('|'), 'gi');
  return text.replace(pattern, (found) => byText.get(found.toLowerCase()) as string);
}

function resolveSubstitutes(overrides: ParseLabelOptions['substitutes']): SeparatorSubstitutes {
  const resolved: SeparatorSubstitutes = {
    gs: overrides?.gs ?? DEFAULT_SUBSTITUTES.gs,
    rs: overrides?.rs ?? DEFAULT_SUBSTITUTES.rs,
    eot: overrides?.eot ?? DEFAULT_SUBSTITUTES.eot,
  };
  for (const kind of ['gs', 'rs', 'eot'] as const) {
    if (resolved[kind].some((s) => s === '')) {
      throw new LabelFormatError(`an empty substitute for ${kind.toUpperCase()} is not allowed`, `substitutes.${kind}`);
    }
  }
  return resolved;
}

function stripScannerPrefix(text: string): string {
  const trimmed = text.replace(/^[ \t\r\n]+/, '');
  const afterId = trimmed.replace(SYMBOLOGY_ID, '');
  return afterId.startsWith(MESSAGE_HEADER) ? afterId : trimmed;
}

function stripTrailer(body: string, warnings: string[]): string {
  const eotAt = body.indexOf(EOT);
  if (eotAt === -1) {
    const withoutEnter = body.replace(/[ \t\r\n]+$/, '');
    if (withoutEnter.endsWith(RS)) {
      warnings.push('trailer incomplete: EOT missing after the final RS');
      return withoutEnter.slice(0, -RS.length);
    }
    warnings.push('trailer missing (RS EOT); the scanner may have dropped it');
    return withoutEnter;
  }
  if (body.slice(eotAt + EOT.length).trim() !== '') warnings.push('text after EOT ignored');
  const content = body.slice(0, eotAt);
  if (content.endsWith(RS)) return content.slice(0, -RS.length);
  warnings.push('trailer incomplete: RS missing before EOT');
  return content;
}

function requireFormat06(header: string): void {
  if (header === FORMAT_06) return;
  if (header === '') throw new LabelFormatError('format header missing after "[)>" RS');
  if (header.length > FORMAT_06.length && header.startsWith(FORMAT_06)) {
    throw new LabelFormatError('missing GS (group separator, 0x1D) after format header 06');
  }
  if (!/^\d{2}$/.test(header)) {
    throw new LabelFormatError(`format header "${header.slice(0, 10)}" is not a two-digit format number`);
  }
  const name = FORMAT_NAMES[header];
  throw new LabelFormatError(
    `format ${header}${name ? ` (${name})` : ''} is not supported; only format 06 (ANSI MH10.8.2 data identifiers) is read`,
  );
}

function readElement(item: string, position: number, warnings: string[]): LabelElement | null {
  const text = item.trim();
  if (text === '') {
    warnings.push(`empty data element at position ${position} skipped`);
    return null;
  }
  const split = splitDataIdentifier(text);
  if (!split) {
    warnings.push(`data element "${text}" at position ${position} has no MH10.8.2 data identifier; skipped`);
    return null;
  }
  const value = split.value.trim();
  if (value === '') {
    warnings.push(`data element ${split.di} at position ${position} has no value; skipped`);
    return null;
  }
  return { di: split.di, value };
}

function mapFields(elements: readonly LabelElement[], warnings: string[]): { fields: LabelFields; unknown: LabelElement[] } {
  const first = new Map<string, string>();
  const unknown: LabelElement[] = [];
  for (const { di, value } of elements) {
    if (!Object.hasOwn(FIELD_OF_DI, di)) {
      unknown.push({ di, value });
      continue;
    }
    const seen = first.get(di);
    if (seen === undefined) first.set(di, value);
    else if (seen !== value) warnings.push(`${di} appears more than once; the first value "${seen}" is used`);
  }

  const fields = emptyFields();
  fields.customerPartNumber = first.get('P') ?? null;
  fields.supplierPartNumber = first.get('1P') ?? null;
  fields.purchaseOrder = first.get('K') ?? null;
  fields.supplierLot = first.get('1T') ?? null;

  const quantity = first.get('Q');
  if (quantity !== undefined) {
    if (!/^\d+(?:\.\d+)?$/.test(quantity)) {
      throw new LabelFormatError(`quantity (DI Q) "${quantity}" is not a number`, 'quantity', 'Q');
    }
    fields.quantity = Number(quantity);
  }

  for (const di of DATE_CODE_PREFERENCE) {
    const value = first.get(di);
    if (value !== undefined) {
      fields.dateCode = value;
      break;
    }
  }

  const country = first.get('4L');
  if (country !== undefined) {
    if (/^[A-Za-z]{2}$/.test(country)) {
      fields.countryOfOrigin = country.toUpperCase();
    } else {
      fields.countryOfOrigin = country;
      warnings.push(`country of origin (DI 4L) "${country}" is not an ISO 3166 alpha-2 code`);
    }
  }

  const msl = first.get('13E');
  if (msl !== undefined) {
    fields.msl = normaliseMslLevel(msl);
    if (fields.msl === null) {
      warnings.push(`moisture sensitivity level (DI 13E) "${msl}" is not a J-STD-020 level`);
    }
  }

  return { fields, unknown };
}

function emptyFields(): LabelFields {
  return {
    customerPartNumber: null,
    supplierPartNumber: null,
    quantity: null,
    purchaseOrder: null,
    supplierLot: null,
    dateCode: null,
    countryOfOrigin: null,
    msl: null,
  };
}

function hasControlCharacter(text: string): boolean {
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x20 || code === 0x7f) return true;
  }
  return false;
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

/**
 * ANSI MH10.8.2 data identifiers seen on component packaging, with descriptions for display
 * (reference.md §3). Not the whole standard: unlisted DIs are still parsed and kept.
 */
export const DATA_IDENTIFIERS: Readonly<Record<string, string>> = {
  P: 'Customer part number',
  '1P': 'Supplier part number',
  '2P': 'Revision',
  Q: 'Quantity',
  K: 'Customer order (PO) number',
  '1K': 'Supplier order number',
  '4K': 'Order line',
  '10K': 'Invoice number',
  '11K': 'Packing list number',
  T: 'Customer-assigned traceability (our lot or bin)',
  '1T': 'Supplier lot / batch',
  '9D': 'Date (mutually defined)',
  '10D': 'Date code YYWW',
  '11D': 'Date code YYYYWW',
  '16D': 'Production date YYYYMMDD',
  '14D': 'Expiry date YYYYMMDD',
  '4L': 'Country of origin (ISO 3166 alpha-2)',
  S: 'Serial number',
  '3S': 'Unique package ID',
  E: 'Environmental class',
  '13E': 'Moisture sensitivity level (J-STD-020)',
  Z: 'Mutually defined',
};

/** An MH10.8.2 DI: one uppercase letter, optionally prefixed by one to three digits. */
const DI_PATTERN = /^(\d{0,3}[A-Z])([\s\S]*)$/;
const DI_ONLY = /^\d{0,3}[A-Z]$/;

/** True when `di` has the MH10.8.2 shape (up to three digits, then one uppercase letter). */
export function isDataIdentifier(di: string): boolean {
  return DI_ONLY.test(di);
}

/**
 * Splits a data element into its MH10.8.2 data identifier and value ("1T12345" → 1T, "12345");
 * null when the element does not start with a DI. The DI is the longest digit run (≤ 3) before
 * the first letter, so a value may itself start with letters or digits.
 */
export function splitDataIdentifier(element: string): { di: string; value: string } | null {
  const match = DI_PATTERN.exec(element);
  if (!match) return null;
  return { di: match[1], value: match[2] };
}

/**
 * Display text for a DI from the MH10.8.2 subset above; 11Z–21Z are free text. Returns null for
 * a DI this dictionary does not describe.
 */
export function describeDataIdentifier(di: string): string | null {
  if (Object.hasOwn(DATA_IDENTIFIERS, di)) return DATA_IDENTIFIERS[di];
  const freeText = /^(\d{2})Z$/.exec(di);
  if (freeText && Number(freeText[1]) >= 11 && Number(freeText[1]) <= 21) return 'Free text';
  return null;
}

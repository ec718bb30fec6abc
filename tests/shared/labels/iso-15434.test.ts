import { describe, it, expect } from 'vitest';
import {
  EOT,
  GS,
  LabelFormatError,
  RS,
  describeDataIdentifier,
  formatLabel,
  parseLabel,
  splitDataIdentifier,
  type LabelElement,
} from '../../../shared/domain/labels/index.ts';

// Envelope "[)>" RS "06" GS … RS EOT with RS 0x1E, GS 0x1D, EOT 0x04: ISO/IEC 15434 (reference.md §3).
// Data identifiers P, 1P, Q, K, 1T, 10D, 4L, 13E: ANSI MH10.8.2 (reference.md §3).
// Part numbers, orders and lots below are invented.
const ELEMENTS = [
  'PHPA-Q-2207', // P customer part number
  '1P2N3904', // 1P supplier part number
  'Q3000', // Q quantity
  'KPO-104552', // K customer order
  '1TZ2315A07', // 1T supplier lot
  '10D2315', // 10D date code YYWW
  '4LMY', // 4L country of origin
  '13E3', // 13E MSL
];
const MESSAGE = `[)>${RS}06${GS}${ELEMENTS.join(GS)}${RS}${EOT}`;

const EXPECTED_FIELDS = {
  customerPartNumber: 'HPA-Q-2207',
  supplierPartNumber: '2N3904',
  quantity: 3000,
  purchaseOrder: 'PO-104552',
  supplierLot: 'Z2315A07',
  dateCode: '2315',
  countryOfOrigin: 'MY',
  msl: '3',
};

function withSeparators(gs: string, rs: string, eot: string): string {
  return `[)>${rs}06${gs}${ELEMENTS.join(gs)}${rs}${eot}`;
}

function message(elements: string[], trailer = `${RS}${EOT}`): string {
  return `[)>${RS}06${GS}${elements.join(GS)}${trailer}`;
}

function catchError(action: () => unknown): LabelFormatError {
  try {
    action();
  } catch (error) {
    if (error instanceof LabelFormatError) return error;
    throw error;
  }
  throw new Error('expected a LabelFormatError');
}

describe('parseLabel — ISO/IEC 15434 format 06 with ANSI MH10.8.2 DIs', () => {
  it('when the message uses real control characters, reads every field without warnings', () => {
    const parsed = parseLabel(MESSAGE);
    expect(parsed.format).toBe('06'); // ISO/IEC 15434 format 06 header
    expect(parsed.fields).toEqual(EXPECTED_FIELDS); // MH10.8.2 DI → field mapping
    expect(parsed.elements).toHaveLength(ELEMENTS.length);
    expect(parsed.elements[1]).toEqual({ di: '1P', value: '2N3904' }); // MH10.8.2: 1P supplier part number
    expect(parsed.unknown).toEqual([]);
    expect(parsed.warnings).toEqual([]);
    expect(parsed.raw).toBe(MESSAGE);
    expect(parsed.plainCode).toBeNull();
  });

  // Substitute styles keyboard-wedge scanners send [common practice]; ISO/IEC 15434 separators.
  it.each([
    ['angle-bracket names', '<GS>', '<RS>', '<EOT>'],
    ['curly-bracket names', '{GS}', '{RS}', '{EOT}'],
    ['caret notation', '^]', '^^', '^D'],
    ['Unicode control pictures', '\u241d', '\u241e', '\u2404'],
    ['lower-case angle-bracket names', '<gs>', '<rs>', '<eot>'],
  ])('when the scanner sends %s for the separators, reads the same fields', (_style, gs, rs, eot) => {
    const parsed = parseLabel(withSeparators(gs, rs, eot));
    expect(parsed.fields).toEqual(EXPECTED_FIELDS);
    expect(parsed.elements).toEqual(parseLabel(MESSAGE).elements);
    expect(parsed.warnings).toEqual([]);
  });

  it('when the site configures its own GS substitute, uses it instead of the default list', () => {
    const custom = { substitutes: { gs: ['@@'] } };
    const parsed = parseLabel(withSeparators('@@', '<RS>', '<EOT>'), custom);
    expect(parsed.fields).toEqual(EXPECTED_FIELDS);
    // The default <GS> is then no longer a separator, so the format header runs into P.
    const error = catchError(() => parseLabel(withSeparators('<GS>', '<RS>', '<EOT>'), custom));
    expect(error.message).toContain('missing GS');
  });

  it('when the scanner prefixes the AIM symbology identifier ]d2, ignores it', () => {
    expect(parseLabel(`]d2${MESSAGE}`).fields).toEqual(EXPECTED_FIELDS);
  });

  // Trailer RS EOT: ISO/IEC 15434. Accepting a missing trailer is a Binwright decision (parseLabel JSDoc).
  it.each([
    ['the whole trailer is missing', '', 'trailer missing'],
    ['EOT is missing after RS', RS, 'EOT missing'],
    ['RS is missing before EOT', EOT, 'RS missing'],
    ['the trailer is missing and the scanner adds Enter', '\r\n', 'trailer missing'],
  ])('when %s, reads the fields and warns', (_case, trailer, warning) => {
    const parsed = parseLabel(message(ELEMENTS, trailer));
    expect(parsed.fields).toEqual(EXPECTED_FIELDS);
    expect(parsed.warnings).toHaveLength(1);
    expect(parsed.warnings[0]).toContain(warning);
  });

  it('when the scanner adds Enter after a complete trailer, gives no warning', () => {
    const parsed = parseLabel(`${MESSAGE}\r\n`);
    expect(parsed.warnings).toEqual([]);
    expect(parsed.fields).toEqual(EXPECTED_FIELDS);
  });

  it('when text follows EOT, ignores it with a warning', () => {
    const parsed = parseLabel(`${MESSAGE}junk`);
    expect(parsed.fields).toEqual(EXPECTED_FIELDS);
    expect(parsed.warnings).toEqual(['text after EOT ignored']);
  });

  // Elements are separated by exactly one GS (ISO/IEC 15434); skipping empties is a Binwright decision.
  it('when two GS follow each other, skips the empty element with a warning naming its position', () => {
    const parsed = parseLabel(message(['PHPA-Q-2207', '', 'Q3000']));
    expect(parsed.elements).toEqual([
      { di: 'P', value: 'HPA-Q-2207' },
      { di: 'Q', value: '3000' },
    ]);
    expect(parsed.warnings).toEqual(['empty data element at position 2 skipped']);
  });

  it('when an element has a DI but no value, skips it with a warning', () => {
    const parsed = parseLabel(message(['PHPA-Q-2207', '1T']));
    expect(parsed.fields.supplierLot).toBeNull();
    expect(parsed.warnings).toEqual(['data element 1T at position 2 has no value; skipped']);
  });

  it('when an element does not start with an MH10.8.2 DI, skips it with a warning', () => {
    // MH10.8.2: a DI is at most three digits followed by one upper-case letter.
    const parsed = parseLabel(message(['PHPA-Q-2207', '1234X9', 'lowercase']));
    expect(parsed.elements).toEqual([{ di: 'P', value: 'HPA-Q-2207' }]);
    expect(parsed.warnings).toHaveLength(2);
  });

  // MH10.8.2 Q: quantity, numeric.
  it.each([['ABC'], ['1,000'], ['3000PCS'], ['-5']])(
    'when the quantity is "%s", throws LabelFormatError naming DI Q',
    (quantity) => {
      const error = catchError(() => parseLabel(message(['PHPA-Q-2207', `Q${quantity}`])));
      expect(error.field).toBe('quantity');
      expect(error.di).toBe('Q');
      expect(error.message).toContain('DI Q');
    },
  );

  it('when the quantity has leading zeros, reads the number', () => {
    expect(parseLabel(message(['Q0003000'])).fields.quantity).toBe(3000); // MH10.8.2 Q numeric
  });

  it('when the label carries DIs without a field, keeps them in unknown and in elements', () => {
    // MH10.8.2 (reference.md §3): 2P revision, 16D production date, 3S package ID, 11Z free text.
    const extra = ['2PB', '16D20260415', '3SUPK0001', '11ZSHIP-NOTE'];
    const parsed = parseLabel(message([...ELEMENTS, ...extra]));
    const expectedUnknown: LabelElement[] = [
      { di: '2P', value: 'B' },
      { di: '16D', value: '20260415' },
      { di: '3S', value: 'UPK0001' },
      { di: '11Z', value: 'SHIP-NOTE' },
    ];
    expect(parsed.unknown).toEqual(expectedUnknown);
    expect(parsed.elements.slice(-4)).toEqual(expectedUnknown);
    expect(parsed.fields).toEqual(EXPECTED_FIELDS);
    expect(parsed.warnings).toEqual([]);
  });

  it('when a mapped DI repeats with another value, keeps the first and warns', () => {
    const parsed = parseLabel(message(['Q3000', 'Q2500']));
    expect(parsed.fields.quantity).toBe(3000);
    expect(parsed.warnings).toEqual(['Q appears more than once; the first value "3000" is used']);
  });

  // MH10.8.2 dates (reference.md §3): 10D YYWW, 9D mutually defined, 11D YYYYWW; 10D preferred (Binwright decision).
  it.each([
    [['9D2314', '10D2315', '11D202316'], '2315'],
    [['11D202316', '9D2314'], '2314'],
    [['11D202316'], '202316'],
  ])('when the date elements are %j, the date code is %s', (dates, expected) => {
    expect(parseLabel(message(dates)).fields.dateCode).toBe(expected);
  });

  // MH10.8.2 4L: country of origin as ISO 3166 alpha-2.
  it('when the country of origin is lower case, upper-cases it', () => {
    expect(parseLabel(message(['4Lmy'])).fields.countryOfOrigin).toBe('MY');
  });

  it('when the country of origin is not two letters, keeps it and warns', () => {
    const parsed = parseLabel(message(['4LMYS']));
    expect(parsed.fields.countryOfOrigin).toBe('MYS');
    expect(parsed.warnings[0]).toContain('ISO 3166 alpha-2');
  });

  // MH10.8.2 13E carries a J-STD-020 level: 1, 2, 2a, 3, 4, 5, 5a, 6 (reference.md §3, §6).
  it.each([
    ['3', '3'],
    ['MSL3', '3'],
    ['MSL 2A', '2a'],
    ['Level 5a', '5a'],
    ['msl-6', '6'],
    ['1', '1'],
  ])('when 13E is "%s", the MSL is %s', (value, expected) => {
    const parsed = parseLabel(message([`13E${value}`]));
    expect(parsed.fields.msl).toBe(expected);
    expect(parsed.warnings).toEqual([]);
  });

  it.each([['7'], ['2b'], ['dry']])('when 13E is "%s", the MSL is null with a warning', (value) => {
    const parsed = parseLabel(message([`13E${value}`]));
    expect(parsed.fields.msl).toBeNull();
    expect(parsed.warnings[0]).toContain('J-STD-020');
  });
});

describe('parseLabel — malformed envelopes and plain codes', () => {
  // Format 05 carries GS1 application identifiers, not MH10.8.2 DIs (ISO/IEC 15434, reference.md §3).
  it.each([
    ['05', 'format 05 (GS1 application identifiers) is not supported'],
    ['12', 'format 12 is not supported'],
  ])('when the format header is %s, throws LabelFormatError saying it is not supported', (format, text) => {
    const error = catchError(() => parseLabel(`[)>${RS}${format}${GS}0101234567890128${RS}${EOT}`));
    expect(error.field).toBe('text');
    expect(error.message).toContain(text);
  });

  it('when RS does not follow "[)>", throws LabelFormatError mentioning RS', () => {
    // The scanner dropped the control characters entirely.
    const error = catchError(() => parseLabel('[)>06PHPA-Q-2207Q3000'));
    expect(error.message).toContain('missing RS');
  });

  it('when GS does not follow the format header, throws LabelFormatError mentioning GS', () => {
    expect(catchError(() => parseLabel(`[)>${RS}06PHPA${RS}${EOT}`)).message).toContain('missing GS');
  });

  it('when the format header is missing, throws LabelFormatError', () => {
    expect(catchError(() => parseLabel(`[)>${RS}${GS}PHPA${RS}${EOT}`)).message).toContain('format header missing');
  });

  it('when a second envelope has another format, reads the 06 envelope and warns', () => {
    const parsed = parseLabel(`[)>${RS}06${GS}Q3000${RS}05${GS}0101234567890128${RS}${EOT}`);
    expect(parsed.fields.quantity).toBe(3000);
    expect(parsed.warnings[0]).toContain('format "05"');
  });

  // Plain 1D codes (Code 128 and similar) are not ISO/IEC 15434 messages: returned as plainCode.
  it.each([
    ['L-20261201-0007', 'L-20261201-0007'],
    ['  PO-104552\r\n', 'PO-104552'],
    ['2N3904', '2N3904'],
  ])('when the text is the plain code %j, returns it trimmed with format null', (text, plainCode) => {
    const parsed = parseLabel(text);
    expect(parsed.format).toBeNull();
    expect(parsed.plainCode).toBe(plainCode);
    expect(parsed.elements).toEqual([]);
    expect(Object.values(parsed.fields).every((v) => v === null)).toBe(true);
    expect(parsed.raw).toBe(text);
  });

  it('when the text is empty, throws LabelFormatError', () => {
    expect(catchError(() => parseLabel('  \n')).field).toBe('text');
  });
});

describe('formatLabel', () => {
  it('when given elements, builds the format 06 envelope byte for byte', () => {
    // ISO/IEC 15434: "[)>" RS "06" GS P… GS Q… RS EOT.
    expect(formatLabel([{ di: 'P', value: 'HPA-Q-2207' }, { di: 'Q', value: '3000' }])).toBe(
      '[)>\u001e06\u001dPHPA-Q-2207\u001dQ3000\u001e\u0004',
    );
  });

  it('when its output is parsed, the same elements come back', () => {
    const elements = parseLabel(MESSAGE).elements;
    const again = parseLabel(formatLabel(elements));
    expect(again.elements).toEqual(elements);
    expect(again.warnings).toEqual([]);
  });

  it.each([
    [[], 'elements'],
    [[{ di: 'p', value: 'x' }], 'elements[0].di'],
    [[{ di: '1234T', value: 'x' }], 'elements[0].di'],
    [[{ di: 'P', value: 'ok' }, { di: 'Q', value: '' }], 'elements[1].value'],
    [[{ di: 'P', value: `A${GS}B` }], 'elements[0].value'],
    [[{ di: 'P', value: ' padded' }], 'elements[0].value'],
  ])('when the elements are %j, throws LabelFormatError for field %s', (elements, field) => {
    expect(catchError(() => formatLabel(elements)).field).toBe(field);
  });
});

describe('data identifiers (ANSI MH10.8.2)', () => {
  it.each([
    ['1T12345', { di: '1T', value: '12345' }],
    ['10D2315', { di: '10D', value: '2315' }],
    ['PABC', { di: 'P', value: 'ABC' }],
    ['13E2a', { di: '13E', value: '2a' }],
    ['1234X9', null],
    ['q100', null],
  ])('splitting "%s" gives %j', (element, expected) => {
    expect(splitDataIdentifier(element)).toEqual(expected);
  });

  it.each([
    ['1T', 'Supplier lot / batch'],
    ['13E', 'Moisture sensitivity level (J-STD-020)'],
    ['15Z', 'Free text'], // reference.md §3: 11Z–21Z free text
    ['22Z', null],
    ['constructor', null],
  ])('describing %s gives %j', (di, text) => {
    expect(describeDataIdentifier(di)).toBe(text);
  });
});

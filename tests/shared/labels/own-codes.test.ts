import { describe, it, expect } from 'vitest';
import {
  LabelFormatError,
  classifyPlainCode,
  makeContainerCode,
  makeLotCode,
  MAX_OWN_CODE_SEQUENCE,
  ownCodeSortKey,
  parseOwnCode,
} from '../../../shared/domain/labels/index.ts';

// Our own code format L-/C-YYYYMMDD-NNNN (4–6 digits) is a Binwright design (own-codes.ts JSDoc), not a standard.
const utc = (y: number, m: number, d: number, h = 12) => new Date(Date.UTC(y, m - 1, d, h));

describe('makeLotCode / makeContainerCode', () => {
  it.each([
    [utc(2026, 12, 1), 7, 'L-20261201-0007'],
    [utc(2027, 1, 9), 123, 'L-20270109-0123'],
    [utc(2026, 2, 28), 9999, 'L-20260228-9999'],
    [utc(2026, 2, 28), 10_000, 'L-20260228-10000'],
    [utc(2026, 2, 28), 123_456, 'L-20260228-123456'],
    [utc(2026, 2, 28), 999_999, 'L-20260228-999999'],
  ])('on %s with sequence %i, the lot code is %s', (date, sequence, code) => {
    expect(makeLotCode(date, sequence)).toBe(code);
  });

  it('for a container, uses the C prefix', () => {
    expect(makeContainerCode(utc(2026, 12, 1), 12)).toBe('C-20261201-0012');
  });

  it('the 10 000th container of a day gets five digits, the 100 000th six', () => {
    expect(makeContainerCode(utc(2026, 12, 1), 9_999)).toBe('C-20261201-9999');
    expect(makeContainerCode(utc(2026, 12, 1), 10_000)).toBe('C-20261201-10000');
    expect(makeContainerCode(utc(2026, 12, 1), 100_000)).toBe('C-20261201-100000');
    expect(MAX_OWN_CODE_SEQUENCE).toBe(999_999);
  });

  it('with a site offset of UTC+1 late in the UTC evening, uses the next local day', () => {
    const lateEvening = new Date(Date.UTC(2026, 11, 1, 23, 30));
    expect(makeLotCode(lateEvening, 1)).toBe('L-20261201-0001');
    expect(makeLotCode(lateEvening, 1, { utcOffsetMinutes: 60 })).toBe('L-20261202-0001');
  });

  it('up to 9 999 a day, sorted as strings, codes come out in issue order across days, months, years and sequence widths', () => {
    const issued = [
      makeLotCode(utc(2026, 9, 30), 1),
      makeLotCode(utc(2026, 9, 30), 9),
      makeLotCode(utc(2026, 9, 30), 10),
      makeLotCode(utc(2026, 9, 30), 100),
      makeLotCode(utc(2026, 10, 1), 1),
      makeLotCode(utc(2026, 12, 31), 2),
      makeLotCode(utc(2027, 1, 1), 1),
    ];
    const shuffled = [issued[3], issued[6], issued[0], issued[5], issued[2], issued[4], issued[1]];
    expect([...shuffled].sort()).toEqual(issued);
  });

  it.each([
    [0, 'sequence'],
    [1_000_000, 'sequence'],
    [-1, 'sequence'],
    [1.5, 'sequence'],
    [Number.NaN, 'sequence'],
  ])('with sequence %s, throws LabelFormatError for field %s', (sequence, field) => {
    let thrown: unknown = null;
    try {
      makeLotCode(utc(2026, 12, 1), sequence);
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toBeInstanceOf(LabelFormatError);
    expect((thrown as LabelFormatError).field).toBe(field);
  });

  it('past 999 999 the message names the limit', () => {
    expect(() => makeContainerCode(utc(2026, 12, 1), 1_000_000)).toThrow('sequence must be a whole number from 1 to 999999');
  });

  it('with an invalid date, throws LabelFormatError for field date', () => {
    expect(() => makeLotCode(new Date(Number.NaN), 1)).toThrow(/date/);
  });
});

describe('parseOwnCode', () => {
  it('reads a lot code back into its parts', () => {
    expect(parseOwnCode('L-20261201-0007')).toEqual({ kind: 'lot', code: 'L-20261201-0007', date: '2026-12-01', sequence: 7 });
  });

  it('reads a lower-case container code with whitespace into canonical form', () => {
    expect(parseOwnCode('  c-20270109-0123\n')).toEqual({
      kind: 'container',
      code: 'C-20270109-0123',
      date: '2027-01-09',
      sequence: 123,
    });
  });

  it.each([
    ['C-20261201-0001', 1],
    ['C-20261201-9999', 9_999],
    ['C-20261201-10000', 10_000],
    ['c-20261201-123456', 123_456],
    ['C-20261201-999999', 999_999],
    ['L-20261201-10000', 10_000],
  ])('reads "%s" (4 to 6 digits) as sequence %i', (text, sequence) => {
    expect(parseOwnCode(text)).toMatchObject({ code: text.toUpperCase(), date: '2026-12-01', sequence });
  });

  it('round-trips container codes of every width: 4-digit codes issued before the widening and 5–6-digit ones', () => {
    for (const sequence of [1, 12, 999, 9_998, 9_999, 10_000, 10_001, 54_321, 99_999, 100_000, 500_000, 999_999]) {
      const code = makeContainerCode(utc(2027, 3, 4), sequence);
      expect(parseOwnCode(code)).toEqual({ kind: 'container', code, date: '2027-03-04', sequence });
    }
  });

  it('round-trips every code makeLotCode produces over a year', () => {
    for (let day = 0; day < 366; day += 7) {
      const date = new Date(Date.UTC(2028, 0, 1 + day, 8));
      const code = makeLotCode(date, day + 1);
      const parsed = parseOwnCode(code);
      expect(parsed?.code).toBe(code);
      expect(parsed?.date).toBe(date.toISOString().slice(0, 10));
      expect(parsed?.sequence).toBe(day + 1);
    }
  });

  it.each([
    ['L-20260230-0001'], // 30 February does not exist
    ['L-20261301-0001'],
    ['L-20261201-0000'],
    ['L-20261201-007'],
    ['C-20261201-00012'], // a second spelling of 12: wide forms never start with 0
    ['C-20261201-012345'],
    ['C-20261201-1000000'], // seven digits
    ['C-20261201-10000X'],
    ['X-20261201-0007'],
    ['L20261201-0007'],
    ['PO-104552'],
    [''],
  ])('returns null for "%s"', (text) => {
    expect(parseOwnCode(text)).toBeNull();
  });
});

describe('ownCodeSortKey', () => {
  it('sorts codes of mixed widths in issue order: …-9999 before …-10000, and by day first', () => {
    const issued = ['C-20261201-0002', 'C-20261201-9999', 'C-20261201-10000', 'C-20261201-99999', 'C-20261201-100000', 'C-20261202-0001', 'C-20261202-10000'];
    const shuffled = [issued[4], issued[1], issued[6], issued[0], issued[5], issued[3], issued[2]] as string[];
    expect([...shuffled].sort((a, b) => ownCodeSortKey(a).localeCompare(ownCodeSortKey(b)))).toEqual(issued);
    // Plain string order gets it wrong past 9 999, which is why the key exists.
    expect([...shuffled].sort()).not.toEqual(issued);
  });

  it('leaves text that is not one of our codes as it is, upper-cased', () => {
    expect(ownCodeSortKey(' bag-7 ')).toBe('BAG-7');
  });
});

describe('classifyPlainCode', () => {
  // Default PO pattern ^PO[-\s]?\d{4,}$ (case-insensitive) is a Binwright default, configurable per site.
  it.each([
    ['L-20261201-0007', 'lot'],
    ['C-20261201-0012', 'container'],
    ['C-20261201-10000', 'container'],
    ['PO-104552', 'purchaseOrder'],
    ['po 1045', 'purchaseOrder'],
    ['PO104552', 'purchaseOrder'],
    ['PO-123', 'unknown'],
    ['4500012345', 'unknown'],
    ['2N3904', 'unknown'],
  ])('with the default pattern, "%s" is %s', (text, kind) => {
    expect(classifyPlainCode(text)).toBe(kind);
  });

  it('with a site pattern given as a string, recognises that site\'s order numbers', () => {
    expect(classifyPlainCode('4500012345', { purchaseOrderPattern: '^45\\d{8}$' })).toBe('purchaseOrder');
    expect(classifyPlainCode('PO-104552', { purchaseOrderPattern: '^45\\d{8}$' })).toBe('unknown');
  });

  it('with a global-flag pattern, gives the same answer on repeated calls', () => {
    const options = { purchaseOrderPattern: /^45\d{8}$/g };
    expect([1, 2, 3].map(() => classifyPlainCode('4500012345', options))).toEqual([
      'purchaseOrder',
      'purchaseOrder',
      'purchaseOrder',
    ]);
  });

  it('with an invalid pattern string, throws LabelFormatError for purchaseOrderPattern', () => {
    expect(() => classifyPlainCode('x', { purchaseOrderPattern: '(' })).toThrow(LabelFormatError);
  });
});

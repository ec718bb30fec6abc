import { describe, it, expect } from 'vitest';
import {
  LabelFormatError,
  classifyPlainCode,
  makeContainerCode,
  makeLotCode,
  parseOwnCode,
} from '../../../shared/domain/labels/index.ts';

// Our own code format L-/C-YYYYMMDD-NNNN is a Binwright design (own-codes.ts JSDoc), not a standard.
const utc = (y: number, m: number, d: number, h = 12) => new Date(Date.UTC(y, m - 1, d, h));

describe('makeLotCode / makeContainerCode', () => {
  it.each([
    [utc(2026, 12, 1), 7, 'L-20261201-0007'],
    [utc(2027, 1, 9), 123, 'L-20270109-0123'],
    [utc(2026, 2, 28), 9999, 'L-20260228-9999'],
  ])('on %s with sequence %i, the lot code is %s', (date, sequence, code) => {
    expect(makeLotCode(date, sequence)).toBe(code);
  });

  it('for a container, uses the C prefix', () => {
    expect(makeContainerCode(utc(2026, 12, 1), 12)).toBe('C-20261201-0012');
  });

  it('with a site offset of UTC+1 late in the UTC evening, uses the next local day', () => {
    const lateEvening = new Date(Date.UTC(2026, 11, 1, 23, 30));
    expect(makeLotCode(lateEvening, 1)).toBe('L-20261201-0001');
    expect(makeLotCode(lateEvening, 1, { utcOffsetMinutes: 60 })).toBe('L-20261202-0001');
  });

  it('sorted as strings, codes come out in issue order across days, months, years and sequence widths', () => {
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
    [10000, 'sequence'],
    [1.5, 'sequence'],
    [Number.NaN, 'sequence'],
  ])('with sequence %s, throws LabelFormatError for field %s', (sequence, field) => {
    expect(() => makeLotCode(utc(2026, 12, 1), sequence)).toThrow(LabelFormatError);
    try {
      makeLotCode(utc(2026, 12, 1), sequence);
    } catch (error) {
      expect((error as LabelFormatError).field).toBe(field);
    }
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
    ['X-20261201-0007'],
    ['L20261201-0007'],
    ['PO-104552'],
    [''],
  ])('returns null for "%s"', (text) => {
    expect(parseOwnCode(text)).toBeNull();
  });
});

describe('classifyPlainCode', () => {
  // Default PO pattern ^PO[-\s]?\d{4,}$ (case-insensitive) is a Binwright default, configurable per site.
  it.each([
    ['L-20261201-0007', 'lot'],
    ['C-20261201-0012', 'container'],
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

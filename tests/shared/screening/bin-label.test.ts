import { describe, expect, it } from 'vitest';
import { formatLabel, parseLabel } from '../../../shared/domain/labels/index.ts';
import { binIntervalText, binLabelElements, labelSlots } from '../../../shared/domain/screening/index.ts';

describe('binIntervalText', () => {
  it('states the half-open interval, and the closed last bin', () => {
    expect(binIntervalText({ hfeMin: 100, hfeMax: 150 }, false)).toBe('100 ≤ hFE < 150');
    expect(binIntervalText({ hfeMin: 200, hfeMax: 300 }, true)).toBe('200 ≤ hFE ≤ 300');
    expect(binIntervalText({ hfeMin: 110.5, hfeMax: 220.25 }, false)).toBe('110.5 ≤ hFE < 220.25');
  });
});

// reference.md §3: P customer (our) part number, T traceability, 1T supplier lot, Q quantity.
describe('binLabelElements', () => {
  it('builds P, T, 1T and Q, which parse back through the ISO/IEC 15434 reader', () => {
    const elements = binLabelElements({ partNumber: 'HP-BC547B', containerCode: 'C-20261201-0012', supplierLot: 'SL-4471', quantity: 48 });
    expect(elements).toEqual([
      { di: 'P', value: 'HP-BC547B' },
      { di: 'T', value: 'C-20261201-0012' },
      { di: '1T', value: 'SL-4471' },
      { di: 'Q', value: '48' },
    ]);
    const parsed = parseLabel(formatLabel(elements));
    expect(parsed.format).toBe('06');
    expect(parsed.fields).toMatchObject({ customerPartNumber: 'HP-BC547B', supplierLot: 'SL-4471', quantity: 48 });
    expect(parsed.elements.find((e) => e.di === 'T')?.value).toBe('C-20261201-0012');
  });

  it('leaves 1T out when the supplier lot is unknown', () => {
    expect(binLabelElements({ partNumber: 'X', containerCode: 'C-20261201-0001', supplierLot: null, quantity: 0 }).map((e) => e.di)).toEqual(['P', 'T', 'Q']);
  });

  it('refuses a negative quantity naming the field', () => {
    expect(() => binLabelElements({ partNumber: 'X', containerCode: 'C', supplierLot: null, quantity: -1 })).toThrowError(expect.objectContaining({ field: 'quantity' }));
  });
});

describe('labelSlots', () => {
  it('on a sheet of 14 starting at cell 12, fills 12–14 then the next sheet from its first cell', () => {
    expect(labelSlots(5, 14, 12)).toEqual([
      { page: 0, cell: 11 },
      { page: 0, cell: 12 },
      { page: 0, cell: 13 },
      { page: 1, cell: 0 },
      { page: 1, cell: 1 },
    ]);
  });
  it('on a roll (one cell per page), each label is its own page', () => {
    expect(labelSlots(3, 1)).toEqual([
      { page: 0, cell: 0 },
      { page: 1, cell: 0 },
      { page: 2, cell: 0 },
    ]);
  });
  it('refuses a start position beyond the sheet, naming startPosition', () => {
    expect(() => labelSlots(1, 14, 15)).toThrowError(expect.objectContaining({ field: 'startPosition' }));
    expect(() => labelSlots(1, 1, 2)).toThrowError(expect.objectContaining({ field: 'startPosition' }));
  });
});

import { describe, expect, it } from 'vitest';
import {
  KIT_LABEL_MAX_CODEWORDS,
  KittingInputError,
  checkPull,
  kitLabelPayload,
  kitPartReferences,
  makeKitCode,
  nextToPull,
  orderPickList,
  parseKitCode,
  parseKitPartReferences,
  pullProgress,
  readPickScan,
  reservationEnd,
  reservationExpired,
} from '../../../shared/domain/kitting/index.ts';
import { dataMatrixCodewords, encodeDataMatrix, parseLabel } from '../../../shared/domain/labels/index.ts';

describe('kit codes', () => {
  it('makeKitCode writes KIT-YYYYMMDD-NNNN on the UTC day; parseKitCode reads it back in any case', () => {
    const code = makeKitCode(new Date('2026-12-01T23:30:00Z'), 7);
    expect(code).toBe('KIT-20261201-0007');
    expect(parseKitCode(' kit-20261201-0007 ')).toBe(code);
  });

  it.each([['KIT-20261301-0001'], ['KIT-20260230-0001'], ['KIT-20261201-0000'], ['C-20261201-0001'], ['KIT-2026121-0001']])('parseKitCode(%s) is null', (t) => {
    expect(parseKitCode(t)).toBeNull();
  });

  it('refuses a sequence outside 1–9999 naming the field', () => {
    expect(() => makeKitCode(new Date(), 0)).toThrow(KittingInputError);
    try {
      makeKitCode(new Date(), 10000);
    } catch (e) {
      expect((e as KittingInputError).field).toBe('sequence');
    }
  });
});

const parts = [
  { containerCode: 'C-20261201-0012', position: 7, location: 'Rack 10', pulledAt: null as string | null },
  { containerCode: 'C-20261201-0003', position: 2, location: 'Rack 2', pulledAt: null as string | null },
  { containerCode: 'C-20261201-0012', position: 3, location: 'Rack 10', pulledAt: null as string | null },
  { containerCode: 'C-20261201-0004', position: 1, location: 'rack 2', pulledAt: '2026-12-01T10:00:00.000Z' as string | null },
];

describe('pick list order, progress and scans', () => {
  it('orders by location (numbers as numbers, case ignored), then container, then position', () => {
    expect(orderPickList(parts).map((p) => `${p.location}|${p.containerCode}/${p.position}`)).toEqual([
      'Rack 2|C-20261201-0003/2',
      'rack 2|C-20261201-0004/1',
      'Rack 10|C-20261201-0012/3',
      'Rack 10|C-20261201-0012/7',
    ]);
  });

  it('nextToPull skips pulled parts; pullProgress counts them', () => {
    expect(nextToPull(parts)).toMatchObject({ containerCode: 'C-20261201-0003', position: 2 });
    expect(pullProgress(parts)).toEqual({ pulled: 1, total: 4, complete: false, text: '1 of 4 pulled' });
    expect(pullProgress(parts.map((p) => ({ ...p, pulledAt: 'x' }))).complete).toBe(true);
    expect(pullProgress([]).complete).toBe(false);
  });

  it.each([
    ['C-20261201-0012', { containerCode: 'C-20261201-0012', position: null }],
    ['c-20261201-0012', { containerCode: 'C-20261201-0012', position: null }],
    ['C-20261201-0012/7', { containerCode: 'C-20261201-0012', position: 7 }],
    ['C-20261201-0012 7', { containerCode: 'C-20261201-0012', position: 7 }],
    ['C-20261201-0012#12', { containerCode: 'C-20261201-0012', position: 12 }],
    ['c-20261201-0012 pos 7', { containerCode: 'C-20261201-0012', position: 7 }],
    ['C-20261201-0012:P7', { containerCode: 'C-20261201-0012', position: 7 }],
    ['C-20261201-10000', { containerCode: 'C-20261201-10000', position: null }],
    ['c-20261201-123456/7', { containerCode: 'C-20261201-123456', position: 7 }],
    ['C-20261201-999999 pos 12', { containerCode: 'C-20261201-999999', position: 12 }],
  ])('readPickScan(%s)', (text, expected) => {
    expect(readPickScan(text)).toEqual(expected);
  });

  it.each([['L-20261201-0001'], ['C-20261301-0001'], ['C-20261201-0012/0'], ['hello'], ['C-20261201-0012/x'], ['C-20261201-00012'], ['C-20261201-001234'], ['C-20261201-1000000']])('readPickScan(%s) is null', (t) => {
    expect(readPickScan(t)).toBeNull();
  });

  it('checkPull accepts a part of the kit not yet pulled', () => {
    const r = checkPull(parts, 'c-20261201-0012', 7);
    expect(r.ok).toBe(true);
  });

  it('checkPull refuses another container, naming the next part to pull', () => {
    const r = checkPull(parts, 'C-20261201-0099', 1);
    expect(r).toMatchObject({ ok: false, reason: 'wrong-container', field: 'containerCode' });
    expect(!r.ok && r.message).toBe('Wrong container: C-20261201-0099 holds no part of this kit. Next to pull: C-20261201-0003 position 2 (Rack 2).');
  });

  it('checkPull refuses a position of the right container that is not in the kit, listing the positions it needs', () => {
    const r = checkPull(parts, 'C-20261201-0012', 5);
    expect(r).toMatchObject({ ok: false, reason: 'wrong-position', field: 'position' });
    expect(!r.ok && r.message).toBe('Wrong position: position 5 of C-20261201-0012 is not part of this kit. From C-20261201-0012 this kit needs positions 3, 7.');
  });

  it('checkPull refuses a part already pulled', () => {
    const r = checkPull(parts, 'C-20261201-0004', 1);
    expect(r).toMatchObject({ ok: false, reason: 'already-pulled', field: 'position' });
    expect(!r.ok && r.message).toContain('Already pulled: position 1 of C-20261201-0004 was pulled for this kit at 2026-12-01T10:00:00.000Z');
  });
});

describe('kit label payload', () => {
  it('groups part references by container, positions ascending, and reads them back', () => {
    const refs = kitPartReferences([
      { containerCode: 'C-20261201-0012', position: 7 },
      { containerCode: 'C-20261201-0013', position: 1 },
      { containerCode: 'C-20261201-0012', position: 3 },
    ]);
    expect(refs).toBe('C-20261201-0012:3,7;C-20261201-0013:1');
    expect(parseKitPartReferences(refs)).toEqual({
      parts: [
        { containerCode: 'C-20261201-0012', position: 3 },
        { containerCode: 'C-20261201-0012', position: 7 },
        { containerCode: 'C-20261201-0013', position: 1 },
      ],
      omitted: 0,
    });
  });

  it('is an ISO/IEC 15434 format-06 message with T, P, Q and 11Z that parses back', () => {
    const p = kitLabelPayload({
      kitCode: 'KIT-20261201-0003',
      partNumbers: ['HPA-N580', 'HPA-P581'],
      parts: [
        { containerCode: 'C-20261201-0001', position: 1 },
        { containerCode: 'C-20261201-0002', position: 4 },
      ],
    });
    expect(p.omittedParts).toBe(0);
    const parsed = parseLabel(p.message);
    expect(parsed.format).toBe('06');
    expect(parsed.elements).toEqual([
      { di: 'T', value: 'KIT-20261201-0003' },
      { di: 'P', value: 'HPA-N580' },
      { di: 'P', value: 'HPA-P581' },
      { di: 'Q', value: '2' },
      { di: '11Z', value: 'C-20261201-0001:1;C-20261201-0002:4' },
    ]);
    expect(p.codewords).toBe(dataMatrixCodewords(p.message).length);
  });

  it('a kit of 40 parts from three containers fits the 52 × 52 symbol whole', () => {
    const parts = Array.from({ length: 40 }, (_, i) => ({ containerCode: `C-20261201-00${10 + (i % 3)}`, position: 1 + Math.floor(i / 3) }));
    const p = kitLabelPayload({ kitCode: 'KIT-20261201-0001', partNumbers: ['HPA-N201'], parts });
    expect(p.listedParts).toBe(40);
    expect(p.codewords).toBeLessThanOrEqual(KIT_LABEL_MAX_CODEWORDS);
    expect(encodeDataMatrix(p.message).size).toBeLessThanOrEqual(52);
  });

  it('a kit too large for the symbol lists what fits and says "+N" for the rest, staying within capacity', () => {
    const parts = Array.from({ length: 200 }, (_, i) => ({ containerCode: `C-20261201-${String(1000 + i).padStart(4, '0')}`, position: 1 + (i % 50) }));
    const p = kitLabelPayload({ kitCode: 'KIT-20261201-0001', partNumbers: ['HPA-N201'], parts });
    expect(p.codewords).toBeLessThanOrEqual(KIT_LABEL_MAX_CODEWORDS);
    expect(p.listedParts).toBeGreaterThan(5);
    expect(p.listedParts + p.omittedParts).toBe(200);
    const z = parseLabel(p.message).elements.find((e) => e.di === '11Z')!.value;
    const back = parseKitPartReferences(z);
    expect(back.parts).toHaveLength(p.listedParts);
    expect(back.omitted).toBe(p.omittedParts);
    // One more part would not fit.
    expect(kitLabelPayload({ kitCode: 'KIT-20261201-0001', partNumbers: ['HPA-N201'], parts: parts.slice(0, p.listedParts + 1) }, KIT_LABEL_MAX_CODEWORDS).omittedParts).toBeGreaterThan(0);
  });

  it('refuses a kit without parts naming the field', () => {
    expect(() => kitLabelPayload({ kitCode: 'KIT-20261201-0001', partNumbers: ['X'], parts: [] })).toThrow(KittingInputError);
  });
});

describe('reservations', () => {
  it('reservationEnd adds the hold; the end itself counts as expired', () => {
    const now = new Date('2026-12-01T08:00:00Z');
    const end = reservationEnd(now, 240);
    expect(end.toISOString()).toBe('2026-12-01T12:00:00.000Z');
    expect(reservationExpired(end, new Date('2026-12-01T11:59:59Z'))).toBe(false);
    expect(reservationExpired(end, end)).toBe(true);
    expect(reservationExpired(end.toISOString(), new Date('2026-12-01T13:00:00Z'))).toBe(true);
    expect(reservationExpired(null, now)).toBe(false);
  });

  it.each([[14], [10081], [30.5]])('reservationEnd refuses a hold of %s minutes naming holdMinutes', (m) => {
    try {
      reservationEnd(new Date(), m);
      expect.unreachable();
    } catch (e) {
      expect((e as KittingInputError).field).toBe('holdMinutes');
    }
  });
});

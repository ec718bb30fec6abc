import { describe, expect, it } from 'vitest';
import { assignBin, type GainBin } from '../../../shared/domain/binning/index.ts';
import {
  ScreeningInputError,
  hasRoom,
  nextFreePosition,
  planPlacement,
  planPlacements,
  type ContainerState,
} from '../../../shared/domain/screening/index.ts';

// Product rule (Binwright, gain binning): hFE intervals are half-open [hfeMin, hfeMax), the
// scheme's last bin closed [hfeMin, hfeMax]; a value on a shared edge belongs to the upper bin.
const scheme: GainBin[] = [
  { code: 'A', label: 'hFE 100–150', hfeMin: 100, hfeMax: 150 },
  { code: 'B', label: 'hFE 150–200', hfeMin: 150, hfeMax: 200 },
  { code: 'C', label: 'hFE 200–300', hfeMin: 200, hfeMax: 300 },
];
const STRIP = { capacity: 3, hasPositions: true };

const box = (over: Partial<ContainerState> & Pick<ContainerState, 'id' | 'binCode'>): ContainerState => ({
  capacity: 3,
  hasPositions: true,
  status: 'open',
  quantity: 0,
  occupied: [],
  ...over,
});

describe('screening edges: a value on a boundary belongs to exactly one bin', () => {
  const edges = [
    { hfe: 100, bin: 'A', why: 'lowest edge, closed below' },
    { hfe: 149.9999, bin: 'A', why: 'just below a shared edge' },
    { hfe: 150, bin: 'B', why: 'a shared edge goes to the upper bin' },
    { hfe: 200, bin: 'C', why: 'a shared edge goes to the upper bin' },
    { hfe: 300, bin: 'C', why: 'the top of the last bin is closed' },
    { hfe: 300.0001, bin: null, why: 'above every bin' },
    { hfe: 99.9999, bin: null, why: 'below every bin' },
  ];
  it.each(edges)('hFE $hfe goes to $bin ($why)', ({ hfe, bin }) => {
    const p = planPlacement(scheme, { hfe }, [], STRIP);
    expect(p.bin).toBe(bin);
    const matching = scheme.filter((b, i) => (i === scheme.length - 1 ? hfe >= b.hfeMin && hfe <= b.hfeMax : hfe >= b.hfeMin && hfe < b.hfeMax));
    expect(matching.length).toBe(bin === null ? 0 : 1);
    expect(assignBin(scheme, { hfe })).toBe(bin);
  });
});

describe('nextFreePosition', () => {
  const cases = [
    { capacity: 5, occupied: [], next: 1, why: 'an empty container starts at 1' },
    { capacity: 5, occupied: [1, 2], next: 3, why: 'after the filled positions' },
    { capacity: 5, occupied: [1, 2, 4], next: 3, why: 'a gap left by a pulled part is reused first' },
    { capacity: 3, occupied: [3, 1, 2], next: null, why: 'a full container has none' },
    { capacity: 2, occupied: [7], next: 1, why: 'positions beyond the capacity are ignored' },
  ];
  it.each(cases)('$why', ({ capacity, occupied, next }) => {
    expect(nextFreePosition(capacity, occupied)).toBe(next);
  });
  it('refuses a capacity below 1 naming the field', () => {
    expect(() => nextFreePosition(0, [])).toThrow(ScreeningInputError);
  });
});

describe('hasRoom', () => {
  it('is false for full, closed and empty containers even with free places', () => {
    expect(hasRoom(box({ id: 1, binCode: 'A', status: 'closed' }))).toBe(false);
    expect(hasRoom(box({ id: 1, binCode: 'A', status: 'full' }))).toBe(false);
    expect(hasRoom(box({ id: 1, binCode: 'A', status: 'empty' }))).toBe(false);
    expect(hasRoom(box({ id: 1, binCode: 'A' }))).toBe(true);
  });
  it('counts parts for a container without positions', () => {
    expect(hasRoom(box({ id: 1, binCode: 'A', hasPositions: false, quantity: 2 }))).toBe(true);
    expect(hasRoom(box({ id: 1, binCode: 'A', hasPositions: false, quantity: 3 }))).toBe(false);
  });
});

describe('planPlacements', () => {
  it('with no container of the bin, opens one and starts at position 1', () => {
    expect(planPlacement(scheme, { hfe: 120 }, [], STRIP)).toEqual({
      bin: 'A',
      container: { existing: false, newIndex: 1 },
      position: 1,
      fillsContainer: false,
    });
  });

  it('puts a part into the open container of its bin at the next free position', () => {
    const containers = [box({ id: 10, binCode: 'B', occupied: [1], quantity: 1 }), box({ id: 11, binCode: 'A', occupied: [1], quantity: 1 })];
    expect(planPlacement(scheme, { hfe: 120 }, containers, STRIP)).toEqual({ bin: 'A', container: { existing: true, id: 11 }, position: 2, fillsContainer: false });
  });

  it('the part that takes the last place says it fills the container; the next one opens a new container', () => {
    const containers = [box({ id: 5, binCode: 'C', occupied: [1, 2], quantity: 2 })];
    const plan = planPlacements(scheme, [{ hfe: 250 }, { hfe: 260 }, { hfe: 270 }], containers, STRIP);
    expect(plan).toEqual([
      { bin: 'C', container: { existing: true, id: 5 }, position: 3, fillsContainer: true },
      { bin: 'C', container: { existing: false, newIndex: 1 }, position: 1, fillsContainer: false },
      { bin: 'C', container: { existing: false, newIndex: 1 }, position: 2, fillsContainer: false },
    ]);
  });

  it('skips a full or closed container of the bin and opens a new one', () => {
    const containers = [box({ id: 1, binCode: 'A', status: 'full', occupied: [1, 2, 3], quantity: 3 }), box({ id: 2, binCode: 'A', status: 'closed', occupied: [1], quantity: 1 })];
    expect(planPlacement(scheme, { hfe: 101 }, containers, STRIP).container).toEqual({ existing: false, newIndex: 1 });
  });

  it('parts outside all bins go to a container of their own (bin null), never a bin container', () => {
    const containers = [box({ id: 1, binCode: 'A' })];
    const plan = planPlacements(scheme, [{ hfe: 50 }, { hfe: 120 }, { hfe: 400 }], containers, STRIP);
    expect(plan.map((p) => [p.bin, p.container])).toEqual([
      [null, { existing: false, newIndex: 1 }],
      ['A', { existing: true, id: 1 }],
      [null, { existing: false, newIndex: 1 }],
    ]);
  });

  it('count-only containers take parts up to their capacity, without positions', () => {
    const plan = planPlacements(scheme, [{ hfe: 160 }, { hfe: 170 }, { hfe: 180 }], [], { capacity: 2, hasPositions: false });
    expect(plan.map((p) => [p.container, p.position, p.fillsContainer])).toEqual([
      [{ existing: false, newIndex: 1 }, null, false],
      [{ existing: false, newIndex: 1 }, null, true],
      [{ existing: false, newIndex: 2 }, null, false],
    ]);
  });

  it('ten parts into two bins with strips of four: exact containers and positions', () => {
    const hfes = [120, 170, 130, 175, 140, 180, 110, 190, 145, 155];
    const plan = planPlacements(scheme, hfes.map((hfe) => ({ hfe })), [], { capacity: 4, hasPositions: true });
    const where = plan.map((p) => `${p.bin}:${p.container.existing ? p.container.id : `new${p.container.newIndex}`}:${p.position}`);
    expect(where).toEqual(['A:new1:1', 'B:new2:1', 'A:new1:2', 'B:new2:2', 'A:new1:3', 'B:new2:3', 'A:new1:4', 'B:new2:4', 'A:new3:1', 'B:new4:1']);
  });

  it('does not change the containers it was given', () => {
    const containers = [box({ id: 1, binCode: 'A', occupied: [1], quantity: 1 })];
    const copy = JSON.parse(JSON.stringify(containers));
    planPlacements(scheme, [{ hfe: 120 }, { hfe: 121 }], containers, STRIP);
    expect(containers).toEqual(copy);
  });

  it('refuses a new-container capacity below 1, naming the field', () => {
    expect(() => planPlacement(scheme, { hfe: 120 }, [], { capacity: 0, hasPositions: true })).toThrowError(
      expect.objectContaining({ field: 'newContainer.capacity' }),
    );
  });
});

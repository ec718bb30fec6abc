import { assignBin, type GainBinScheme, type PartMeasurement } from '../binning/index.ts';
import { ScreeningInputError } from './errors.ts';
import type { ContainerState, NewContainerSpec, Placement } from './types.ts';

function checkCapacity(capacity: number, field: string): void {
  if (!Number.isInteger(capacity) || capacity < 1) throw new ScreeningInputError(field, 'capacity must be a whole number ≥ 1');
}

/**
 * The lowest position 1…capacity that holds no part, or null when every position is taken.
 * Positions are 1-based; occupied positions outside 1…capacity are ignored.
 */
export function nextFreePosition(capacity: number, occupied: readonly number[]): number | null {
  checkCapacity(capacity, 'capacity');
  const taken = new Set(occupied);
  for (let p = 1; p <= capacity; p++) if (!taken.has(p)) return p;
  return null;
}

/** True when screening may put one more part into the container: open and not at capacity. */
export function hasRoom(c: ContainerState): boolean {
  if (c.status !== 'open') return false;
  if (c.hasPositions) return nextFreePosition(c.capacity, c.occupied) !== null;
  return c.quantity < c.capacity;
}

interface Working {
  ref: Placement['container'];
  binCode: string | null;
  capacity: number;
  hasPositions: boolean;
  open: boolean;
  quantity: number;
  occupied: Set<number>;
}

function take(w: Working): { position: number | null; fills: boolean } {
  let position: number | null = null;
  if (w.hasPositions) {
    for (let p = 1; p <= w.capacity; p++) {
      if (!w.occupied.has(p)) {
        position = p;
        break;
      }
    }
    if (position === null) throw new Error('take() on a full container');
    w.occupied.add(position);
  }
  w.quantity++;
  const fills = w.hasPositions ? w.occupied.size >= w.capacity : w.quantity >= w.capacity;
  if (fills) w.open = false;
  return { position, fills };
}

/**
 * Plans where each screened part goes, in the order given: its bin by `assignBin` (hFE
 * intervals [min, max), the scheme's last bin closed; null = outside all bins), then the first
 * open container of that bin (in the order the containers are listed) with room — the lowest
 * free position of a positioned container, or one more in a count-only one. When no open
 * container of the bin has room, the plan opens a new one (`newContainer`), numbered in
 * `container.newIndex`, and later parts of the bin fill it. Containers that are full, closed or
 * empty never receive parts. Pure: the inputs are not changed.
 * @throws ScreeningInputError for a bad capacity; BinningInputError for a non-finite reading.
 */
export function planPlacements(
  scheme: GainBinScheme,
  parts: readonly PartMeasurement[],
  containers: readonly ContainerState[],
  newContainer: NewContainerSpec,
): Placement[] {
  checkCapacity(newContainer.capacity, 'newContainer.capacity');
  containers.forEach((c, i) => checkCapacity(c.capacity, `containers[${i}].capacity`));
  const working: Working[] = containers.map((c) => ({
    ref: { existing: true, id: c.id },
    binCode: c.binCode,
    capacity: c.capacity,
    hasPositions: c.hasPositions,
    open: hasRoom(c),
    quantity: c.quantity,
    occupied: new Set(c.hasPositions ? c.occupied : []),
  }));
  let opened = 0;
  return parts.map((part) => {
    const bin = assignBin(scheme, part);
    let target = working.find((w) => w.open && w.binCode === bin);
    if (!target) {
      opened++;
      target = {
        ref: { existing: false, newIndex: opened },
        binCode: bin,
        capacity: newContainer.capacity,
        hasPositions: newContainer.hasPositions,
        open: true,
        quantity: 0,
        occupied: new Set(),
      };
      working.push(target);
    }
    const { position, fills } = take(target);
    return { bin, container: target.ref, position, fillsContainer: fills };
  });
}

/** `planPlacements` for one part. */
export function planPlacement(
  scheme: GainBinScheme,
  part: PartMeasurement,
  containers: readonly ContainerState[],
  newContainer: NewContainerSpec,
): Placement {
  return planPlacements(scheme, [part], containers, newContainer)[0] as Placement;
}

import type { DryBagState, FloorLifeView } from '../../../shared/api/lots.ts';
import { MSL_FLOOR_LIFE, floorLifeStatus, normaliseMslLevel, type MslLevel } from '../../../shared/domain/moisture/index.ts';

const CLOCKED: ReadonlySet<MslLevel> = new Set<MslLevel>(['2a', '3', '4', '5', '5a', '6']);
const PROCEDURE = "follow J-STD-033 and your site's moisture-control procedure";

/**
 * A lot's floor-life view: the lot's labelled MSL (else the part type's) and its dry-bag state,
 * run through the J-STD-033 clock of shared/domain/moisture at the server's `now`.
 */
export function lotFloorLife(
  lot: { msl: string | null; dryBag: DryBagState; bagOpenedAt: Date | null },
  partTypeMsl: string | null,
  now: Date,
): FloorLifeView {
  const level = normaliseMslLevel(lot.msl ?? '') ?? normaliseMslLevel(partTypeMsl ?? '');
  const bagOpenedAt = lot.bagOpenedAt ? lot.bagOpenedAt.toISOString() : null;
  const none = { floorLifeHours: null, hoursLeft: null, expiresAt: null, bagOpenedAt };
  if (!level) return { state: 'not-applicable', msl: null, ...none, message: 'Not moisture-classified: no floor-life clock is kept.' };

  const hours = MSL_FLOOR_LIFE[level].hours;
  if (!CLOCKED.has(level)) {
    const s = floorLifeStatus({ level, openedAt: now, now });
    return { state: 'not-applicable', msl: level, ...none, floorLifeHours: hours, message: s.message };
  }
  const life = level === '6' ? 'bake before use, then the time on the label' : `${hours} h at ≤ 30 °C / 60 % RH`;
  if (lot.dryBag === 'sealed' || (lot.dryBag === 'opened' && !lot.bagOpenedAt)) {
    return {
      state: 'sealed',
      msl: level,
      ...none,
      floorLifeHours: hours,
      message: `MSL ${level}: dry bag sealed. The floor-life clock (${life}) starts when the bag is opened.`,
    };
  }
  if (lot.dryBag === 'not-applicable') {
    return {
      state: 'unknown',
      msl: level,
      ...none,
      floorLifeHours: hours,
      message: `MSL ${level} parts received without a dry bag: their exposure is unknown; ask quality whether a bake is needed before use — ${PROCEDURE}.`,
    };
  }
  const openedAt = lot.bagOpenedAt as Date;
  // A clock slightly behind the recorded opening time must not throw.
  const s = floorLifeStatus({ level, openedAt, now: now < openedAt ? openedAt : now });
  return {
    state: s.state === 'not-applicable' ? 'not-applicable' : s.state,
    msl: level,
    floorLifeHours: s.floorLifeHours,
    hoursLeft: s.hoursLeft,
    expiresAt: s.expiresAt ? s.expiresAt.toISOString() : null,
    bagOpenedAt,
    message: s.message,
  };
}

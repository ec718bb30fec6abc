import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { ScreeningSetup } from '../../shared/api/bins.ts';
import type { User } from '../../server/modules/users/user.entity.ts';
import { makeUser } from './helpers.ts';

const uniq = () => randomUUID().replace(/-/g, '').slice(0, 10).toUpperCase();

/** Two adjacent bins over the part's hFE limits 100–300: A [100, 200), B [200, 300]. */
export const TWO_BINS = [
  { code: 'A', label: 'Gain group A', hfeMin: 100, hfeMax: 200 },
  { code: 'B', label: 'Gain group B', hfeMin: 200, hfeMax: 300 },
];

export interface ScreenLot {
  lotId: number;
  lotCode: string;
  partTypeId: number;
  partNumber: string;
  supplierLot: string;
  schemeId: number | null;
  sessionId: number;
  inspector: User;
}

export interface ScreenLotOptions {
  bins?: { code: string; label: string; hfeMin: number; hfeMax: number }[] | null;
  /** Tie the scheme to the lot already (otherwise screening ties the part type's current version). */
  attachScheme?: boolean;
  quantity?: number;
  setup?: ScreeningSetup;
}

/**
 * A supplier, an invented NPN part type with a gain-bin scheme version, a lot and an open
 * screening session, written straight to the database so the Bins tests do not depend on the
 * Dock or Bench screens.
 */
export async function makeScreenLot(ds: DataSource, o: ScreenLotOptions = {}): Promise<ScreenLot> {
  const inspector = await makeUser(ds, 'inspector');
  const [supplier] = (await ds.query(`INSERT INTO supplier (code, name) VALUES ($1, $2) RETURNING id`, [`TB${uniq()}`, `Test Bins Distribution ${uniq()}`])) as { id: number }[];
  const partNumber = `TB-${uniq()}`;
  const [part] = (await ds.query(
    `INSERT INTO part_type (part_number, description, polarity, package, hfe_ic_ma, hfe_vce_v, vbe_ic_ma, hfe_min, hfe_max, vbe_min_mv, vbe_max_mv)
     VALUES ($1, 'Test NPN for screening', 'NPN', 'TO-92', 2, 5, 2, 100, 300, 550, 750) RETURNING id`,
    [partNumber],
  )) as { id: number }[];
  let schemeId: number | null = null;
  const bins = o.bins === undefined ? TWO_BINS : o.bins;
  if (bins) {
    const [s] = (await ds.query(`INSERT INTO gain_bin_scheme (part_type_id, version) VALUES ($1, 1) RETURNING id`, [part.id])) as { id: number }[];
    schemeId = s.id;
    for (const [i, b] of bins.entries()) {
      await ds.query(`INSERT INTO gain_bin (scheme_id, position, code, label, hfe_min, hfe_max) VALUES ($1, $2, $3, $4, $5, $6)`, [s.id, i, b.code, b.label, b.hfeMin, b.hfeMax]);
    }
  }
  const lotCode = `L-TB-${uniq()}`;
  const supplierLot = `SL-${uniq().slice(0, 6)}`;
  const [lot] = (await ds.query(
    `INSERT INTO lot (code, supplier_id, part_type_id, quantity, supplier_lot, bin_scheme_id, received_by)
     VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
    [lotCode, supplier.id, part.id, o.quantity ?? 1000, supplierLot, o.attachScheme ? schemeId : null, inspector.id],
  )) as { id: number }[];
  const [session] = (await ds.query(
    `INSERT INTO measurement_session (lot_id, instrument, ambient_c, operator_id, mode) VALUES ($1, 'Test curve tracer', 25, $2, 'screen') RETURNING id`,
    [lot.id, inspector.id],
  )) as { id: number }[];
  if (o.setup) {
    await ds.query(`INSERT INTO screening_setup (lot_id, kind, capacity, has_positions, location) VALUES ($1, $2, $3, $4, $5)`, [
      lot.id,
      o.setup.kind,
      o.setup.capacity,
      o.setup.hasPositions,
      o.setup.location,
    ]);
  }
  return { lotId: lot.id, lotCode, partTypeId: part.id, partNumber, supplierLot, schemeId, sessionId: session.id, inspector };
}

/**
 * Writes current readings at 25 °C (so hfe_25 = hfe) for the next free lot positions, in the
 * order given, straight to the database — as if recorded and not yet placed. Returns their ids.
 */
export async function addReadings(
  ds: DataSource,
  f: ScreenLot,
  hfes: number[],
  o: { mode?: 'screen' | 'sample'; vbeMv?: number } = {},
): Promise<string[]> {
  let sessionId = f.sessionId;
  if (o.mode === 'sample') {
    const [s] = (await ds.query(
      `INSERT INTO measurement_session (lot_id, instrument, ambient_c, operator_id, mode) VALUES ($1, 'Test meter', 25, $2, 'sample') RETURNING id`,
      [f.lotId, f.inspector.id],
    )) as { id: number }[];
    sessionId = s.id;
  }
  const [{ top }] = (await ds.query(`SELECT coalesce(max(position), 0)::int AS top FROM measurement WHERE lot_id = $1`, [f.lotId])) as { top: number }[];
  const ids: string[] = [];
  for (const [i, hfe] of hfes.entries()) {
    const vbe = o.vbeMv ?? 650 + i * 0.1;
    const [row] = (await ds.query(
      `INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, hfe_25, vbe_mv_25, created_by)
       VALUES ($1, $2, $3, $4, $5, $4, $5, $6) RETURNING id`,
      [f.lotId, sessionId, top + 1 + i, hfe, vbe, f.inspector.id],
    )) as { id: string }[];
    ids.push(String(row.id));
  }
  return ids;
}

/** A correction of a reading, written like the Bench does: the old row superseded, a new row naming it. */
export async function correctReading(ds: DataSource, f: ScreenLot, measurementId: string, hfe: number): Promise<string> {
  const [old] = (await ds.query(`SELECT position, vbe_mv FROM measurement WHERE id = $1`, [measurementId])) as { position: number; vbe_mv: number }[];
  await ds.query(`UPDATE measurement SET superseded = true WHERE id = $1`, [measurementId]);
  const [row] = (await ds.query(
    `INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, hfe_25, vbe_mv_25, created_by, supersedes_id, correction_reason)
     VALUES ($1, $2, $3, $4, $5, $4, $5, $6, $7, 'misread') RETURNING id`,
    [f.lotId, f.sessionId, old.position, hfe, old.vbe_mv, f.inspector.id, measurementId],
  )) as { id: string }[];
  return String(row.id);
}

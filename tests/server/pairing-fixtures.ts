import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { Polarity } from '../../shared/api/catalog.ts';
import type { PlaceScreenedResponse } from '../../shared/api/bins.ts';
import { placeUnplaced } from '../../server/modules/bins/screening.service.ts';
import type { User } from '../../server/modules/users/user.entity.ts';
import { makeUser } from './helpers.ts';

const uniq = () => randomUUID().replace(/-/g, '').slice(0, 10).toUpperCase();

export interface StockPartType {
  partTypeId: number;
  partNumber: string;
  polarity: Polarity;
}

/** An invented part type with one wide gain bin (hFE 10–2000) and the given default matching tolerances. */
export async function makePairingPartType(ds: DataSource, o: { polarity?: Polarity; matchHfePct?: number; matchVbeMv?: number; prefix?: string } = {}): Promise<StockPartType> {
  const polarity = o.polarity ?? 'NPN';
  const partNumber = `${o.prefix ?? 'TP'}-${polarity}-${uniq()}`;
  const [part] = (await ds.query(
    `INSERT INTO part_type (part_number, description, polarity, package, hfe_ic_ma, hfe_vce_v, vbe_ic_ma, hfe_min, hfe_max, vbe_min_mv, vbe_max_mv, match_hfe_pct, match_vbe_mv, esd_hbm_class)
     VALUES ($1, $2, $3, 'TO-92', 2, 5, 2, 10, 2000, 400, 900, $4, $5, '1B') RETURNING id`,
    [partNumber, `Invented ${polarity} for pairing tests`, polarity, o.matchHfePct ?? 5, o.matchVbeMv ?? 2],
  )) as { id: number }[];
  const [scheme] = (await ds.query(`INSERT INTO gain_bin_scheme (part_type_id, version) VALUES ($1, 1) RETURNING id`, [part.id])) as { id: number }[];
  await ds.query(`INSERT INTO gain_bin (scheme_id, position, code, label, hfe_min, hfe_max) VALUES ($1, 0, 'W', 'Wide', 10, 2000)`, [scheme.id]);
  return { partTypeId: part.id, partNumber, polarity };
}

export interface StockLot extends StockPartType {
  lotId: number;
  lotCode: string;
  supplierLot: string;
  supplierName: string;
  inspector: User;
  placed: PlaceScreenedResponse;
  /** Container codes in order of opening. */
  containers: { id: number; code: string; location: string }[];
}

/**
 * A lot of the part type screened 100 % into positioned containers (strips of `capacity` at
 * `location`): readings at 25 °C written straight to the database, then placed by the Bins
 * service as the bench would. Parts go to positions 1, 2, … in the order given.
 */
export async function makeStockLot(
  ds: DataSource,
  pt: StockPartType,
  parts: { hfe: number; vbeMv: number }[],
  o: { capacity?: number; location?: string } = {},
): Promise<StockLot> {
  const inspector = await makeUser(ds, 'inspector');
  const supplierName = `Test Pairing Distribution ${uniq()}`;
  const [supplier] = (await ds.query(`INSERT INTO supplier (code, name) VALUES ($1, $2) RETURNING id`, [`TP${uniq()}`, supplierName])) as { id: number }[];
  const lotCode = `L-TP-${uniq()}`;
  const supplierLot = `SL-${uniq().slice(0, 6)}`;
  const [lot] = (await ds.query(
    `INSERT INTO lot (code, supplier_id, part_type_id, quantity, supplier_lot, received_by) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id`,
    [lotCode, supplier.id, pt.partTypeId, Math.max(1, parts.length), supplierLot, inspector.id],
  )) as { id: number }[];
  const [session] = (await ds.query(
    `INSERT INTO measurement_session (lot_id, instrument, ambient_c, operator_id, mode) VALUES ($1, 'Test curve tracer', 25, $2, 'screen') RETURNING id`,
    [lot.id, inspector.id],
  )) as { id: number }[];
  await ds.query(`INSERT INTO screening_setup (lot_id, kind, capacity, has_positions, location) VALUES ($1, 'strip', $2, true, $3)`, [lot.id, o.capacity ?? 50, o.location ?? 'Rack 1']);
  if (parts.length) {
    await ds.query(
      `INSERT INTO measurement (lot_id, session_id, position, hfe, vbe_mv, hfe_25, vbe_mv_25, created_by)
       SELECT $1, $2, t.pos, t.h, t.v, t.h, t.v, $3 FROM unnest($4::int[], $5::float8[], $6::float8[]) AS t(pos, h, v)`,
      [lot.id, session.id, inspector.id, parts.map((_, i) => i + 1), parts.map((p) => p.hfe), parts.map((p) => p.vbeMv)],
    );
  }
  const placed = await placeUnplaced(ds, { id: inspector.id, email: inspector.email, name: inspector.name, role: 'inspector' }, lot.id, false);
  const containers = (await ds.query(`SELECT id, code, location FROM container WHERE lot_id = $1 ORDER BY id`, [lot.id])) as { id: number; code: string; location: string }[];
  return { ...pt, lotId: lot.id, lotCode, supplierLot, supplierName, inspector, placed, containers };
}

/** Moves a container to another storage location straight in the database (the pick list sorts by it). */
export async function setLocation(ds: DataSource, containerId: number, location: string): Promise<void> {
  await ds.query(`UPDATE container SET location = $2 WHERE id = $1`, [containerId, location]);
}

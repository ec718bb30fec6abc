import type { DataSource, EntityManager } from 'typeorm';
import type { Polarity } from '../../../shared/api/catalog.ts';
import type {
  KitDetail,
  KitFilters,
  KitPartLine,
  KitPartTypeInfo,
  KitRow,
  KitSetView,
  KitSort,
  KitSourceLot,
  KitStatus,
  LotKitRow,
  MatchMode,
  SetSize,
} from '../../../shared/api/pairing.ts';
import type { Page } from '../../../shared/api/page.ts';
import { orderPickList } from '../../../shared/domain/kitting/index.ts';
import { AppError } from '../../http/app-error.ts';
import { likePattern } from '../../http/route-params.ts';
import { meaningFromStored } from './set-meaning.ts';

const iso = (d: Date | string | null): string | null => (d === null ? null : new Date(d).toISOString());

/** Columns of a kit row with its part numbers, counts and creator (alias k). */
const KIT_ROW_SELECT = `
  SELECT k.id, k.code, k.status, k.mode, k.set_size, k.sets_wanted, k.hfe_tolerance_pct, k.vbe_tolerance_mv,
         k.reserved_until, k.created_at, u.name AS created_by_name,
         p1.part_number AS part_number, p2.part_number AS complement_part_number,
         (SELECT count(*)::int FROM kit_part kp WHERE kp.kit_id = k.id AND kp.released_at IS NULL) AS parts,
         (SELECT count(*)::int FROM kit_part kp WHERE kp.kit_id = k.id AND kp.pulled_at IS NOT NULL) AS pulled
    FROM kit_request k
    JOIN app_user u ON u.id = k.created_by
    JOIN part_type p1 ON p1.id = k.part_type_id
    LEFT JOIN part_type p2 ON p2.id = k.complement_part_type_id`;

interface KitSqlRow {
  id: number;
  code: string;
  status: KitStatus;
  mode: MatchMode;
  set_size: number;
  sets_wanted: number;
  hfe_tolerance_pct: number;
  vbe_tolerance_mv: number;
  reserved_until: Date | null;
  created_at: Date;
  created_by_name: string;
  part_number: string;
  complement_part_number: string | null;
  parts: number;
  pulled: number;
}

function toKitRow(r: KitSqlRow): KitRow {
  return {
    id: r.id,
    code: r.code,
    status: r.status,
    mode: r.mode,
    setSize: r.set_size as SetSize,
    setsWanted: r.sets_wanted,
    partNumbers: r.complement_part_number ? [r.part_number, r.complement_part_number] : [r.part_number],
    parts: r.parts,
    pulled: r.pulled,
    hfeTolerancePct: r.hfe_tolerance_pct,
    vbeToleranceMv: r.vbe_tolerance_mv,
    reservedUntil: iso(r.reserved_until),
    createdAt: new Date(r.created_at).toISOString(),
    createdByName: r.created_by_name,
  };
}

const SORT_SQL: Record<KitSort, string> = {
  createdAt: 'k.created_at',
  code: 'k.code',
  status: 'k.status',
  reservedUntil: 'k.reserved_until',
};

/** A page of kits, filtered and sorted on the server. */
export async function listKits(ds: DataSource, f: Required<Pick<KitFilters, 'page' | 'pageSize'>> & KitFilters): Promise<Page<KitRow>> {
  const params: unknown[] = [];
  const where: string[] = [];
  if (f.status) {
    params.push(f.status);
    where.push(`k.status = $${params.length}`);
  }
  if (f.search) {
    params.push(likePattern(f.search));
    const p = `$${params.length}`;
    where.push(`(k.code ILIKE ${p} ESCAPE '\\' OR p1.part_number ILIKE ${p} ESCAPE '\\' OR p2.part_number ILIKE ${p} ESCAPE '\\')`);
  }
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [{ total }] = (await ds.query(
    `SELECT count(*)::int AS total FROM kit_request k JOIN part_type p1 ON p1.id = k.part_type_id LEFT JOIN part_type p2 ON p2.id = k.complement_part_type_id ${whereSql}`,
    params,
  )) as { total: number }[];
  const dir = f.dir === 'asc' ? 'ASC' : 'DESC';
  params.push(f.pageSize, (f.page - 1) * f.pageSize);
  const rows = (await ds.query(
    `${KIT_ROW_SELECT} ${whereSql} ORDER BY ${SORT_SQL[f.sort ?? 'createdAt']} ${dir} NULLS LAST, k.id ${dir} LIMIT $${params.length - 1} OFFSET $${params.length}`,
    params,
  )) as KitSqlRow[];
  return { items: rows.map(toKitRow), total, page: f.page, pageSize: f.pageSize };
}

/** Columns of one kit part with its container, lot, supplier, measurement and part type (alias kp). */
export const KIT_PART_SELECT = `
  SELECT kp.id, kp.kit_set_id, ks.set_index, kp.container_id, c.code AS container_code, kp.position, c.location, c.bin_code,
         kp.measurement_id, kp.lot_id, l.code AS lot_code, l.supplier_lot, s.name AS supplier_name,
         pt.id AS part_type_id, pt.part_number, pt.polarity, me.hfe_25, me.vbe_mv_25,
         kp.pulled_at, pu.name AS pulled_by_name, kp.released_at
    FROM kit_part kp
    JOIN kit_set ks ON ks.id = kp.kit_set_id
    JOIN container c ON c.id = kp.container_id
    JOIN lot l ON l.id = kp.lot_id
    JOIN supplier s ON s.id = l.supplier_id
    JOIN part_type pt ON pt.id = c.part_type_id
    JOIN measurement me ON me.id = kp.measurement_id
    LEFT JOIN app_user pu ON pu.id = kp.pulled_by`;

/** Where a part sits and what it is: the columns a stock row and a kit part row share. */
export interface PartPlaceSqlRow {
  container_id: number;
  container_code: string;
  position: number;
  location: string;
  bin_code: string | null;
  measurement_id: string;
  lot_id: number;
  lot_code: string;
  supplier_lot: string | null;
  supplier_name: string;
  part_type_id: number;
  part_number: string;
  polarity: Polarity;
  hfe_25: number;
  vbe_mv_25: number;
}

export interface KitPartSqlRow extends PartPlaceSqlRow {
  id: string;
  kit_set_id: number;
  set_index: number;
  pulled_at: Date | null;
  pulled_by_name: string | null;
  released_at: Date | null;
}

export function toKitPartLine(r: KitPartSqlRow): KitPartLine {
  return {
    setIndex: r.set_index,
    containerId: r.container_id,
    containerCode: r.container_code,
    position: r.position,
    location: r.location,
    measurementId: String(r.measurement_id),
    lotId: r.lot_id,
    lotCode: r.lot_code,
    supplierLot: r.supplier_lot,
    supplierName: r.supplier_name,
    partTypeId: r.part_type_id,
    partNumber: r.part_number,
    polarity: r.polarity,
    hfe25: r.hfe_25,
    vbeMv25: r.vbe_mv_25,
    binCode: r.bin_code,
    pulledAt: iso(r.pulled_at),
    pulledByName: r.pulled_by_name,
    releasedAt: iso(r.released_at),
  };
}

/** The parts of a kit (all of them, released ones included) in pick-list order. */
export async function loadKitParts(m: EntityManager, kitId: number): Promise<KitPartLine[]> {
  const rows = (await m.query(`${KIT_PART_SELECT} WHERE kp.kit_id = $1`, [kitId])) as KitPartSqlRow[];
  return orderPickList(rows.map(toKitPartLine));
}

export const PART_TYPE_INFO_SELECT = `SELECT id, part_number, description, polarity, match_hfe_pct, match_vbe_mv, esd_hbm_class FROM part_type`;

export interface PartTypeInfoSqlRow {
  id: number;
  part_number: string;
  description: string;
  polarity: Polarity;
  match_hfe_pct: number;
  match_vbe_mv: number;
  esd_hbm_class: string | null;
}

export function toPartTypeInfo(r: PartTypeInfoSqlRow): KitPartTypeInfo {
  return {
    id: r.id,
    partNumber: r.part_number,
    description: r.description,
    polarity: r.polarity,
    matchHfePct: r.match_hfe_pct,
    matchVbeMv: r.match_vbe_mv,
    esdHbmClass: r.esd_hbm_class,
  };
}

/** Parts of a set in display order: NPN before PNP, then by hFE. */
export function setPartOrder(a: Pick<KitPartLine, 'polarity' | 'hfe25'>, b: Pick<KitPartLine, 'polarity' | 'hfe25'>): number {
  return (a.polarity === b.polarity ? 0 : a.polarity === 'NPN' ? -1 : 1) || a.hfe25 - b.hfe25;
}

/** Lots (with supplier lots) the parts of a kit come from, most parts first. */
export function sourceLotsOf(parts: readonly KitPartLine[]): KitSourceLot[] {
  const byLot = new Map<number, KitSourceLot>();
  for (const p of parts) {
    const s = byLot.get(p.lotId) ?? { lotId: p.lotId, lotCode: p.lotCode, supplierLot: p.supplierLot, supplierName: p.supplierName, partNumber: p.partNumber, parts: 0 };
    s.parts++;
    byLot.set(p.lotId, s);
  }
  return [...byLot.values()].sort((a, b) => b.parts - a.parts || a.lotCode.localeCompare(b.lotCode));
}

/** One kit with its sets, pick list (storage order), source lots and history fields; 404 when absent. */
export async function loadKitDetail(m: EntityManager, id: number): Promise<KitDetail> {
  const rows = (await m.query(`${KIT_ROW_SELECT} WHERE k.id = $1`, [id])) as KitSqlRow[];
  const row = rows[0];
  if (!row) throw AppError.notFound(`Kit ${id}`);
  const [extra] = (await m.query(
    `SELECT k.part_type_id, k.complement_part_type_id, k.note, k.completed_at, k.cancelled_at, k.expired_at, cu.name AS cancelled_by_name
       FROM kit_request k LEFT JOIN app_user cu ON cu.id = k.cancelled_by WHERE k.id = $1`,
    [id],
  )) as { part_type_id: number; complement_part_type_id: number | null; note: string | null; completed_at: Date | null; cancelled_at: Date | null; expired_at: Date | null; cancelled_by_name: string | null }[];
  const typeIds = [extra.part_type_id, ...(extra.complement_part_type_id ? [extra.complement_part_type_id] : [])];
  const types = ((await m.query(`${PART_TYPE_INFO_SELECT} WHERE id = ANY($1)`, [typeIds])) as PartTypeInfoSqlRow[]).map(toPartTypeInfo);
  types.sort((a, b) => typeIds.indexOf(a.id) - typeIds.indexOf(b.id));
  const sets = (await m.query(
    `SELECT id, set_index, hfe_spread_pct, vbe_spread_mv, mismatch, mirror_ratio, offset_mv, hfe_ratio FROM kit_set WHERE kit_id = $1 ORDER BY set_index`,
    [id],
  )) as { id: number; set_index: number; hfe_spread_pct: number; vbe_spread_mv: number; mismatch: number; mirror_ratio: number; offset_mv: number; hfe_ratio: number }[];
  const parts = await loadKitParts(m, id);
  const held = parts.filter((p) => p.releasedAt === null);
  const setViews: KitSetView[] = sets.map((s) => ({
    index: s.set_index,
    hfeSpreadPct: s.hfe_spread_pct,
    vbeSpreadMv: s.vbe_spread_mv,
    mismatch: s.mismatch,
    meaning: meaningFromStored({ mirrorRatio: s.mirror_ratio, offsetMv: s.offset_mv, hfeRatio: s.hfe_ratio }),
    parts: parts.filter((p) => p.setIndex === s.set_index).sort(setPartOrder),
  }));
  return {
    ...toKitRow(row),
    partTypes: types,
    note: extra.note,
    sets: setViews,
    pickList: held,
    sourceLots: sourceLotsOf(held.length ? held : parts),
    completedAt: iso(extra.completed_at),
    cancelledAt: iso(extra.cancelled_at),
    cancelledByName: extra.cancelled_by_name,
    expiredAt: iso(extra.expired_at),
    released: parts.length - held.length,
  };
}

/** Which kits hold (or held, pulled) parts of a lot: GET /api/lots/:id/kits. */
export async function lotKits(ds: DataSource, lotId: number): Promise<LotKitRow[]> {
  const lot = (await ds.query(`SELECT id FROM lot WHERE id = $1`, [lotId])) as { id: number }[];
  if (!lot[0]) throw AppError.notFound(`Lot ${lotId}`);
  const rows = (await ds.query(
    `SELECT k.id, k.code, k.status, k.created_at, u.name AS created_by_name,
            count(*)::int AS parts, count(kp.pulled_at)::int AS pulled,
            min(kp.pulled_at) AS first_pulled_at, max(kp.pulled_at) AS last_pulled_at
       FROM kit_part kp
       JOIN kit_request k ON k.id = kp.kit_id
       JOIN app_user u ON u.id = k.created_by
      WHERE kp.lot_id = $1 AND kp.released_at IS NULL
      GROUP BY k.id, u.name
      ORDER BY k.created_at DESC, k.id DESC`,
    [lotId],
  )) as {
    id: number;
    code: string;
    status: KitStatus;
    created_at: Date;
    created_by_name: string;
    parts: number;
    pulled: number;
    first_pulled_at: Date | null;
    last_pulled_at: Date | null;
  }[];
  return rows.map((r) => ({
    kitId: r.id,
    code: r.code,
    status: r.status,
    parts: r.parts,
    pulled: r.pulled,
    firstPulledAt: iso(r.first_pulled_at),
    lastPulledAt: iso(r.last_pulled_at),
    createdAt: new Date(r.created_at).toISOString(),
    createdByName: r.created_by_name,
  }));
}

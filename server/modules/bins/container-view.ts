import type { EntityManager } from 'typeorm';
import type { ContainerBin, ContainerRow } from '../../../shared/api/bins.ts';
import { OUTSIDE_BINS_LABEL } from '../../../shared/api/bins.ts';
import type { ContainerKind, ContainerStatus } from '../../../shared/domain/screening/index.ts';
import { AppError } from '../../http/app-error.ts';

/** The columns of a container row with its lot, part, bin and creator (alias c). */
export const CONTAINER_SELECT = `
  SELECT c.id, c.code, c.lot_id, c.part_type_id, c.bin_scheme_id, c.gain_bin_id, c.bin_code, c.kind, c.capacity,
         c.has_positions, c.quantity, c.location, c.status, c.version, c.created_at, c.updated_at,
         l.code AS lot_code, l.supplier_lot, p.part_number, u.name AS created_by_name,
         s.version AS scheme_version, b.label AS bin_label, b.hfe_min, b.hfe_max, (SELECT count(*)::int FROM gain_bin g WHERE g.scheme_id = c.bin_scheme_id AND g.position < b.position) AS bin_index,
         (b.position = (SELECT max(g.position) FROM gain_bin g WHERE g.scheme_id = c.bin_scheme_id)) AS bin_is_last,
         (SELECT count(*)::int FROM label_print lp WHERE lp.container_id = c.id) AS label_prints
    FROM container c
    JOIN lot l ON l.id = c.lot_id
    JOIN part_type p ON p.id = c.part_type_id
    JOIN app_user u ON u.id = c.created_by
    JOIN gain_bin_scheme s ON s.id = c.bin_scheme_id
    LEFT JOIN gain_bin b ON b.id = c.gain_bin_id`;

export interface ContainerSqlRow {
  id: number;
  code: string;
  lot_id: number;
  part_type_id: number;
  bin_scheme_id: number;
  gain_bin_id: number | null;
  bin_code: string | null;
  kind: ContainerKind;
  capacity: number;
  has_positions: boolean;
  quantity: number;
  location: string;
  status: ContainerStatus;
  version: number;
  created_at: Date;
  updated_at: Date;
  lot_code: string;
  supplier_lot: string | null;
  part_number: string;
  created_by_name: string;
  scheme_version: number;
  bin_label: string | null;
  hfe_min: number | null;
  hfe_max: number | null;
  bin_index: number | null;
  bin_is_last: boolean | null;
  label_prints: number;
}

export function toContainerBin(r: Pick<ContainerSqlRow, 'bin_code' | 'bin_label' | 'hfe_min' | 'hfe_max' | 'bin_index' | 'bin_is_last' | 'bin_scheme_id' | 'scheme_version'>): ContainerBin {
  return {
    code: r.bin_code,
    label: r.bin_code === null ? OUTSIDE_BINS_LABEL : (r.bin_label ?? r.bin_code),
    hfeMin: r.bin_code === null ? null : r.hfe_min,
    hfeMax: r.bin_code === null ? null : r.hfe_max,
    index: r.bin_code === null ? null : r.bin_index,
    isLast: r.bin_is_last === true,
    schemeId: r.bin_scheme_id,
    schemeVersion: r.scheme_version,
  };
}

export function toContainerRow(r: ContainerSqlRow): ContainerRow {
  return {
    id: r.id,
    code: r.code,
    lotId: r.lot_id,
    lotCode: r.lot_code,
    supplierLot: r.supplier_lot,
    partTypeId: r.part_type_id,
    partNumber: r.part_number,
    bin: toContainerBin(r),
    kind: r.kind,
    capacity: r.capacity,
    hasPositions: r.has_positions,
    quantity: r.quantity,
    location: r.location,
    status: r.status,
    version: r.version,
    createdAt: new Date(r.created_at).toISOString(),
    createdByName: r.created_by_name,
    labelPrints: r.label_prints,
  };
}

/** One container row by id, or 404. */
export async function loadContainerRow(m: EntityManager, id: number): Promise<ContainerSqlRow> {
  const rows = (await m.query(`${CONTAINER_SELECT} WHERE c.id = $1`, [id])) as ContainerSqlRow[];
  if (!rows[0]) throw AppError.notFound(`Container ${id}`);
  return rows[0];
}

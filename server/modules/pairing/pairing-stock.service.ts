import type { DataSource } from 'typeorm';
import type { PairingStockRow } from '../../../shared/api/pairing.ts';
import { toPartTypeInfo, type PartTypeInfoSqlRow } from './kit-view.ts';

/**
 * GET /api/pairing/stock: part types with measured parts in positioned containers (inside the
 * gain bins), how many are in stock and reserved, and their default matching tolerances.
 */
export async function pairingStock(ds: DataSource): Promise<PairingStockRow[]> {
  const rows = (await ds.query(
    `SELECT pt.id, pt.part_number, pt.description, pt.polarity, pt.match_hfe_pct, pt.match_vbe_mv, pt.esd_hbm_class,
            count(*) FILTER (WHERE cp.state = 'in-stock')::int AS in_stock,
            count(*) FILTER (WHERE cp.state = 'reserved')::int AS reserved,
            count(DISTINCT c.id) FILTER (WHERE cp.state = 'in-stock')::int AS containers
       FROM container_position cp
       JOIN container c ON c.id = cp.container_id
       JOIN part_type pt ON pt.id = c.part_type_id
      WHERE cp.state IN ('in-stock','reserved') AND c.has_positions AND c.bin_code IS NOT NULL
      GROUP BY pt.id
      ORDER BY pt.part_number`,
  )) as (PartTypeInfoSqlRow & { in_stock: number; reserved: number; containers: number })[];
  return rows.map((r) => ({ ...toPartTypeInfo(r), inStock: r.in_stock, reserved: r.reserved, containers: r.containers }));
}

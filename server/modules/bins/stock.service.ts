import type { DataSource } from 'typeorm';
import { OUTSIDE_BINS_LABEL, type StockBin, type StockPartType, type StockResponse } from '../../../shared/api/bins.ts';
import type { ContainerStatus } from '../../../shared/domain/screening/index.ts';
import { containerCodeOrderSql } from './container-code.ts';

interface Row {
  part_type_id: number;
  part_number: string;
  bin_code: string | null;
  bin_label: string | null;
  hfe_min: number | null;
  hfe_max: number | null;
  bin_index: number | null;
  bin_is_last: boolean | null;
  scheme_version: number;
  container_id: number;
  code: string;
  lot_code: string;
  location: string;
  quantity: number;
  status: ContainerStatus;
}

/**
 * Quantity on hand per part type × bin × container (containers holding at least one part). A
 * bin code used by several scheme versions is one bar; its label and interval are those of the
 * newest version in stock. Bins are in ascending hFE, the parts outside all bins last.
 */
export async function stockByBin(ds: DataSource, partTypeId?: number): Promise<StockResponse> {
  const params: unknown[] = [];
  let where = 'c.quantity > 0';
  if (partTypeId !== undefined) {
    params.push(partTypeId);
    where += ` AND c.part_type_id = $1`;
  }
  const rows = (await ds.query(
    `SELECT c.part_type_id, p.part_number, c.bin_code, b.label AS bin_label, b.hfe_min, b.hfe_max, (SELECT count(*)::int FROM gain_bin g WHERE g.scheme_id = c.bin_scheme_id AND g.position < b.position) AS bin_index,
            (b.position = (SELECT max(g.position) FROM gain_bin g WHERE g.scheme_id = c.bin_scheme_id)) AS bin_is_last,
            s.version AS scheme_version, c.id AS container_id, c.code, l.code AS lot_code, c.location, c.quantity, c.status
       FROM container c
       JOIN part_type p ON p.id = c.part_type_id
       JOIN lot l ON l.id = c.lot_id
       JOIN gain_bin_scheme s ON s.id = c.bin_scheme_id
       LEFT JOIN gain_bin b ON b.id = c.gain_bin_id
      WHERE ${where}
      ORDER BY p.part_number, ${containerCodeOrderSql('c.code')}`,
    params,
  )) as Row[];
  const parts = new Map<number, StockPartType & { newest: Map<string, number> }>();
  for (const r of rows) {
    let part = parts.get(r.part_type_id);
    if (!part) {
      part = { partTypeId: r.part_type_id, partNumber: r.part_number, quantity: 0, bins: [], newest: new Map() };
      parts.set(r.part_type_id, part);
    }
    const key = r.bin_code ?? '';
    let bin = part.bins.find((b) => (b.code ?? '') === key);
    if (!bin) {
      bin = { code: r.bin_code, label: OUTSIDE_BINS_LABEL, hfeMin: null, hfeMax: null, index: null, isLast: false, quantity: 0, containers: [] } satisfies StockBin;
      part.bins.push(bin);
    }
    if (r.bin_code !== null && (part.newest.get(key) ?? -1) < r.scheme_version) {
      part.newest.set(key, r.scheme_version);
      Object.assign(bin, { label: r.bin_label ?? r.bin_code, hfeMin: r.hfe_min, hfeMax: r.hfe_max, index: r.bin_index, isLast: r.bin_is_last === true });
    }
    bin.quantity += r.quantity;
    part.quantity += r.quantity;
    bin.containers.push({ containerId: r.container_id, code: r.code, lotCode: r.lot_code, location: r.location, quantity: r.quantity, status: r.status });
  }
  return {
    partTypes: [...parts.values()].map(({ newest: _newest, ...p }) => ({
      ...p,
      bins: p.bins.sort((a, b) => (a.code === null ? 1 : b.code === null ? -1 : (a.hfeMin ?? 0) - (b.hfeMin ?? 0) || String(a.code).localeCompare(String(b.code)))),
    })),
  };
}

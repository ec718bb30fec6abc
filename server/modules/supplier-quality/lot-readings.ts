import type { EntityManager } from 'typeorm';

/**
 * The readings the Suppliers area works with: current (not superseded) hFE at 25 °C of the sample
 * sessions. Screening sessions (100 % after acceptance) are left out, so every lot weighs by its
 * sample and scorecards, charts and drift checks all see the same numbers.
 */
export const SAMPLE_READINGS_SQL = `
  SELECT m.lot_id, m.hfe_25, m.vbe_mv_25
    FROM measurement m
    JOIN measurement_session s ON s.id = m.session_id AND s.mode = 'sample'
   WHERE NOT m.superseded`;

/** Lot statuses after a signed disposition. */
export const FINAL_STATUSES = ['accepted', 'rejected', 'mrb'] as const;

/** hFE readings of each given lot (sample sessions, 25 °C). */
export async function sampleHfeByLot(m: EntityManager, lotIds: number[]): Promise<Map<number, number[]>> {
  const out = new Map<number, number[]>(lotIds.map((id) => [id, []]));
  if (lotIds.length === 0) return out;
  const rows = (await m.query(
    `SELECT r.lot_id, array_agg(r.hfe_25 ORDER BY r.hfe_25) AS values FROM (${SAMPLE_READINGS_SQL} AND m.lot_id = ANY($1)) r GROUP BY r.lot_id`,
    [lotIds],
  )) as { lot_id: number; values: number[] }[];
  for (const r of rows) out.set(r.lot_id, r.values.map(Number));
  return out;
}

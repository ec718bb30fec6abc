import type { Response } from 'express';
import type { DataSource } from 'typeorm';
import { limitFlags } from '../../../shared/domain/inspection/index.ts';
import { loadLotContext } from '../bench/lot-context.ts';

const PAGE = 20_000;

/** Quotes a CSV text field and defuses spreadsheet formulas (a leading = + - @ gets a quote). */
function text(s: string): string {
  const safe = /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

const num = (v: number | null) => (v === null ? '' : String(v));

interface Row {
  id: string;
  position: number;
  hfe: number;
  vbe_mv: number;
  vce_sat_mv: number | null;
  leakage_na: number | null;
  hfe_25: number;
  vbe_mv_25: number;
  ambient_c: number;
  instrument: string;
  session_id: number;
  source: string;
  source_row: number | null;
  supersedes_id: string | null;
  superseded: boolean;
  correction_reason: string | null;
  created_by: string;
  created_at: Date;
}

/**
 * Streams a lot's readings as CSV (current readings; with history, superseded ones too), raw and
 * referred to 25 °C, paged by id so a 100 000-part lot never sits in memory at once.
 */
export async function writeMeasurementsCsv(ds: DataSource, lotId: number, history: boolean, res: Response): Promise<void> {
  const { lot, partType } = await loadLotContext(ds.manager, lotId);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${lot.code}-measurements.csv"`);
  res.write(
    'position,hfe,vbe_mv,vce_sat_mv,leakage_na,ambient_c,hfe_25,vbe_mv_25,outside_limits,instrument,session_id,source,source_row,measurement_id,supersedes_id,superseded,correction_reason,recorded_by,recorded_at\r\n',
  );
  let after = '0';
  for (;;) {
    const rows = (await ds.query(
      `SELECT m.id, m.position, m.hfe, m.vbe_mv, m.vce_sat_mv, m.leakage_na, m.hfe_25, m.vbe_mv_25, s.ambient_c, s.instrument,
              m.session_id, m.source, m.source_row, m.supersedes_id, m.superseded, m.correction_reason, u.name AS created_by, m.created_at
         FROM measurement m
         JOIN measurement_session s ON s.id = m.session_id
         JOIN app_user u ON u.id = m.created_by
        WHERE m.lot_id = $1 AND m.id > $2 ${history ? '' : 'AND NOT m.superseded'}
        ORDER BY m.id LIMIT ${PAGE}`,
      [lotId, after],
    )) as Row[];
    if (!rows.length) break;
    const lines = rows.map((r) =>
      [
        r.position,
        num(r.hfe),
        num(r.vbe_mv),
        num(r.vce_sat_mv),
        num(r.leakage_na),
        num(r.ambient_c),
        num(r.hfe_25),
        num(r.vbe_mv_25),
        limitFlags(partType, r.hfe_25, r.vbe_mv_25).join(' '),
        text(r.instrument),
        r.session_id,
        r.source,
        r.source_row ?? '',
        r.id,
        r.supersedes_id ?? '',
        r.superseded ? 'yes' : 'no',
        text(r.correction_reason ?? ''),
        text(r.created_by),
        new Date(r.created_at).toISOString(),
      ].join(','),
    );
    res.write(`${lines.join('\r\n')}\r\n`);
    after = rows[rows.length - 1].id;
    if (rows.length < PAGE) break;
  }
  res.end();
}

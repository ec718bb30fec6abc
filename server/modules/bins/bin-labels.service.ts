import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import { binLabelStock, type BinLabelsRequest } from '../../../shared/api/bins.ts';
import { formatLabel } from '../../../shared/domain/labels/index.ts';
import { binIntervalText, binLabelElements, labelSlots } from '../../../shared/domain/screening/index.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { renderBinLabels, type BinLabelContent } from './bin-label-pdf.ts';
import { CONTAINER_SELECT, type ContainerSqlRow } from './container-view.ts';

type Row = ContainerSqlRow & { polarity: string; hfe_ic_ma: number; hfe_vce_v: number };

function content(r: Row): BinLabelContent {
  const sign = r.polarity === 'PNP' ? '−' : '';
  return {
    containerCode: r.code,
    binCode: r.bin_code,
    binLabel: r.bin_code === null ? 'Outside all bins' : (r.bin_label ?? r.bin_code),
    binIndex: r.bin_code === null ? null : r.bin_index,
    interval:
      r.bin_code === null || r.hfe_min === null || r.hfe_max === null
        ? `Not in any bin of scheme v${r.scheme_version}`
        : `${binIntervalText({ hfeMin: r.hfe_min, hfeMax: r.hfe_max }, r.bin_is_last === true)} (scheme v${r.scheme_version})`,
    testCondition: `at IC = ${sign}${r.hfe_ic_ma} mA, VCE = ${sign}${r.hfe_vce_v} V, 25 °C`,
    partNumber: r.part_number,
    lotCode: r.lot_code,
    supplierLot: r.supplier_lot,
    quantity: r.quantity,
    date: new Date(r.created_at).toISOString().slice(0, 10),
    inspector: r.created_by_name,
    payload: formatLabel(binLabelElements({ partNumber: r.part_number, containerCode: r.code, supplierLot: r.supplier_lot, quantity: r.quantity })),
  };
}

export interface PrintedLabels {
  pdf: Buffer;
  jobId: string;
  labels: number;
  reprints: number;
}

/**
 * One PDF of bin labels for the containers, in the order given, on a stock (roll or sheet grid
 * from a start position). Every label printed is recorded in label_print (a container printed
 * before counts as a reprint) with one audit entry for the job. The same containers in the same
 * state give the same bytes: the PDF's creation date is the newest container's opening time.
 */
export async function printBinLabels(ds: DataSource, actor: SessionUser, input: BinLabelsRequest): Promise<PrintedLabels> {
  const stock = binLabelStock(input.stock);
  if (!stock) throw AppError.badRequest('Unknown label stock.', [{ field: 'stock', message: 'unknown stock' }]);
  const cells = stock.columns * stock.rows;
  const start = input.startPosition ?? 1;
  if (start > cells) {
    throw AppError.unprocessable(`This stock has ${cells} label${cells === 1 ? '' : 's'} per ${stock.kind === 'roll' ? 'label' : 'sheet'}.`, [
      { field: 'startPosition', message: `startPosition must be from 1 to ${cells}` },
    ]);
  }
  const ids = input.containerIds;
  if (new Set(ids).size !== ids.length) throw AppError.badRequest('A container is listed twice.', [{ field: 'containerIds', message: 'each container once' }]);
  const rows = (await ds.query(
    `${CONTAINER_SELECT.replace('FROM container c', ', p.polarity, p.hfe_ic_ma, p.hfe_vce_v FROM container c')} WHERE c.id = ANY($1)`,
    [ids],
  )) as Row[];
  const byId = new Map(rows.map((r) => [r.id, r]));
  const missing = ids.filter((id) => !byId.has(id));
  if (missing.length) throw AppError.notFound(`Container${missing.length > 1 ? 's' : ''} ${missing.join(', ')}`);
  const ordered = ids.map((id) => byId.get(id) as Row);
  const labels = ordered.map(content);
  const creation = new Date(Math.max(...ordered.map((r) => new Date(r.created_at).getTime())));
  creation.setUTCMilliseconds(0);
  const pdf = await renderBinLabels(labels, stock, start, creation);
  const slots = labelSlots(labels.length, cells, start);
  const jobId = randomUUID();
  const reprints = await ds.transaction(async (m) => {
    const before = (await m.query(`SELECT DISTINCT container_id FROM label_print WHERE container_id = ANY($1)`, [ids])) as { container_id: number }[];
    const printed = new Set(before.map((r) => r.container_id));
    await m.query(
      `INSERT INTO label_print (job_id, container_id, stock, page, cell, reprint, quantity, payload, printed_by)
       SELECT $1, t.c, $2, t.page, t.cell, t.reprint, t.q, t.payload, $3
         FROM unnest($4::int[], $5::int[], $6::int[], $7::boolean[], $8::int[], $9::text[]) AS t(c, page, cell, reprint, q, payload)`,
      [
        jobId,
        stock.id,
        actor.id,
        ids,
        slots.map((s) => s.page),
        slots.map((s) => s.cell),
        ids.map((id) => printed.has(id)),
        ordered.map((r) => r.quantity),
        labels.map((l) => l.payload),
      ],
    );
    const reprinted = ordered.filter((r) => printed.has(r.id)).map((r) => r.code);
    await recordAudit(m, {
      actor,
      action: reprinted.length ? 'labels.bins.reprint' : 'labels.bins.print',
      entityType: 'label-job',
      entityId: jobId,
      after: { stock: stock.id, startPosition: start, containers: ordered.map((r) => r.code), reprints: reprinted },
    });
    return reprinted.length;
  });
  return { pdf, jobId, labels: labels.length, reprints };
}

import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { MeasurementRow, MeasurementSort } from '../../../../shared/api/measurements.ts';
import { describeFlag, type PartLimits } from '../../../../shared/domain/inspection/index.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { useMeasurements } from '../api/get-measurements.ts';

const PAGE_SIZE = 25;
const fmt = (v: number | null, d = 1) => (v === null ? '–' : v.toFixed(d));

/** The lot's readings, raw and at 25 °C, sorted, filtered and paged on the server. */
export function MeasurementsTable({ lotId, limits }: { lotId: number; limits: PartLimits }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'position', desc: false });
  const [flagged, setFlagged] = useState(false);
  const [history, setHistory] = useState(false);
  const q = useMeasurements(lotId, { page, pageSize: PAGE_SIZE, sort: (sort?.id ?? 'position') as MeasurementSort, dir: sort?.desc ? 'desc' : 'asc', flagged, history });

  const columns = useMemo<ColumnDef<MeasurementRow, unknown>[]>(
    () => [
      { id: 'position', accessorKey: 'position', header: 'Pos', cell: ({ row }) => <span className="num">{row.original.position}</span> },
      { id: 'hfe', header: 'hFE', enableSorting: false, cell: ({ row }) => <span className="num">{row.original.hfe}</span> },
      { id: 'vbeMv', header: 'Vbe mV', enableSorting: false, cell: ({ row }) => <span className="num">{fmt(row.original.vbeMv)}</span> },
      { id: 'hfe25', accessorKey: 'hfe25', header: 'hFE 25 °C', cell: ({ row }) => <span className="num">{fmt(row.original.hfe25)}</span> },
      { id: 'vbeMv25', accessorKey: 'vbeMv25', header: 'Vbe 25 °C', cell: ({ row }) => <span className="num">{fmt(row.original.vbeMv25)}</span> },
      { id: 'vceSatMv', header: 'VCE(sat) mV', enableSorting: false, cell: ({ row }) => <span className="num">{fmt(row.original.vceSatMv, 0)}</span> },
      { id: 'leakageNa', header: 'Leak nA', enableSorting: false, cell: ({ row }) => <span className="num">{fmt(row.original.leakageNa, 2)}</span> },
      {
        id: 'result',
        header: 'Result',
        enableSorting: false,
        cell: ({ row }) => (
          <span className="flex flex-wrap gap-1">
            {row.original.superseded && <StatusTag tone="neutral">superseded</StatusTag>}
            {row.original.flags.length ? <StatusTag tone="fail">{row.original.flags.map((f) => describeFlag(f, limits)).join('; ')}</StatusTag> : <StatusTag tone="pass">within limits</StatusTag>}
          </span>
        ),
      },
      {
        id: 'createdAt',
        accessorKey: 'createdAt',
        header: 'Recorded',
        cell: ({ row }) => (
          <span className="text-xs text-ink-soft" title={row.original.correctionReason ?? undefined}>
            {row.original.source === 'import' ? 'import' : 'grid'} · {row.original.createdByName} · {new Date(row.original.createdAt).toLocaleTimeString()}
            {row.original.supersedesId ? ` · correction: ${row.original.correctionReason ?? ''}` : ''}
          </span>
        ),
      },
    ],
    [limits],
  );

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap gap-4 text-sm">
        <label className="flex items-center gap-1.5">
          <input
            type="checkbox"
            checked={flagged}
            onChange={(e) => {
              setFlagged(e.target.checked);
              setPage(1);
            }}
          />
          Only parts outside the limits
        </label>
        <label className="flex items-center gap-1.5">
          <input
            type="checkbox"
            checked={history}
            onChange={(e) => {
              setHistory(e.target.checked);
              setPage(1);
            }}
          />
          Include superseded readings
        </label>
      </div>
      {q.isError ? (
        <Notice tone="fail" title="Readings could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Readings of the lot"
          columns={columns}
          rows={q.data?.items ?? []}
          total={q.data?.total ?? 0}
          page={page}
          pageSize={PAGE_SIZE}
          sort={sort}
          onSortChange={(s) => {
            setSort(s);
            setPage(1);
          }}
          onPageChange={setPage}
          loading={q.isLoading}
          getRowId={(r) => r.id}
          empty={flagged ? 'No part is outside the limits.' : 'No readings yet. Start a session and enter parts, or import a tester file.'}
        />
      )}
    </div>
  );
}

import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import type { ScorecardPeriod, ScorecardRow, ScorecardSort } from '../../../../shared/api/supplier-quality.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { useDebounced } from '../../../lib/use-debounced.ts';
import { scorecardsCsvUrl, useScorecards } from '../api/get-scorecards.ts';
import { dppm, num, pct } from './format.ts';
import { SeverityTag } from './severity-tag.tsx';

const PAGE_SIZE = 20;
const SORTABLE = new Set<string>(['supplierName', 'lotsReceived', 'acceptanceRate', 'dppm', 'cocOnTimeRate', 'openAlerts']);

/** Every supplier's lot quality over the period; sorted and paged on the server, exported as CSV. */
export function ScorecardsTable({ period, detailPath }: { period: ScorecardPeriod; detailPath: (supplierId: number) => string }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'supplierName', desc: false });
  const [search, setSearch] = useState('');
  const debounced = useDebounced(search, 250);
  const q = useScorecards({ ...period, page, pageSize: PAGE_SIZE, search: debounced || undefined, sort: sort?.id as ScorecardSort | undefined, dir: sort?.desc ? 'desc' : 'asc' });

  const columns = useMemo<ColumnDef<ScorecardRow, unknown>[]>(
    () => ([
      {
        id: 'supplierName',
        header: 'Supplier',
        cell: ({ row }) => (
          <Link to={detailPath(row.original.supplierId)} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
            {row.original.supplierName}
          </Link>
        ),
      },
      { id: 'lotsReceived', header: 'Lots', cell: ({ row }) => <span className="num">{row.original.lotsReceived}</span> },
      {
        id: 'outcomes',
        header: 'Accepted / rejected / MRB',
        cell: ({ row }) => (
          <span className="num">
            {row.original.accepted} / {row.original.rejected} / {row.original.mrb}
            {row.original.pending > 0 && <span className="text-ink-faint"> · {row.original.pending} open</span>}
          </span>
        ),
      },
      { id: 'acceptanceRate', header: 'Lot acceptance', cell: ({ row }) => <span className="num font-semibold">{pct(row.original.acceptanceRate)}</span> },
      { id: 'dppm', header: 'DPPM (sample)', cell: ({ row }) => <span className="num">{dppm(row.original.dppm)}</span> },
      { id: 'cocOnTimeRate', header: 'CoC on time', cell: ({ row }) => <span className="num">{pct(row.original.cocOnTimeRate)}</span> },
      {
        id: 'meanHfe',
        header: 'Mean hFE',
        cell: ({ row }) => (row.original.partTypes > 1 ? <span className="text-xs text-ink-faint">{row.original.partTypes} part types</span> : <span className="num">{num(row.original.meanHfe)}</span>),
      },
      { id: 'severity', header: 'Inspection', cell: ({ row }) => <SeverityTag severity={row.original.severity} /> },
      {
        id: 'openAlerts',
        header: 'Open alerts',
        cell: ({ row }) => (row.original.openAlerts ? <StatusTag tone="hold">{row.original.openAlerts} open</StatusTag> : <span className="text-ink-faint">none</span>),
      },
      { id: 'openNcrs', header: 'Open NCRs', cell: ({ row }) => <span className="num">{row.original.openNcrs}</span> },
    ] satisfies ColumnDef<ScorecardRow, unknown>[]).map((c) => ({ ...c, enableSorting: SORTABLE.has(c.id) })),
    [detailPath],
  );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Search
          <input
            type="search"
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              setPage(1);
            }}
            placeholder="Supplier name or code"
            className="w-64 rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
          />
        </label>
        <a href={scorecardsCsvUrl(period)} className="rounded-md border border-rule bg-panel px-3 py-1.5 text-sm font-semibold text-ink hover:bg-paper" download>
          Export CSV
        </a>
      </div>
      {q.isError ? (
        <Notice tone="fail" title="The scorecards could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Supplier scorecards"
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
          getRowId={(r) => String(r.supplierId)}
          empty={search ? 'No supplier matches the search.' : 'No suppliers yet.'}
        />
      )}
      <p className="text-xs text-ink-faint">
        Lot acceptance = accepted ÷ disposed lots received in the period. DPPM = sampled parts outside a limit ÷ sampled parts × 10⁶ (an estimate from the samples). CoC on time = certificate uploaded within 24 h of receipt. Inspection = current ISO 2859-1 switching severity (the most severe across part types).
      </p>
    </div>
  );
}

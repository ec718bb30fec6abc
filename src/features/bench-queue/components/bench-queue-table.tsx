import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import type { BenchQueueRow, BenchQueueSort, LotStatus } from '../../../../shared/api/bench.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { useBenchQueue } from '../api/get-bench-queue.ts';

const PAGE_SIZE = 20;

const FILTERS = [
  { value: 'received,inspecting', label: 'To inspect' },
  { value: 'awaiting-signature', label: 'Awaiting signature' },
  { value: 'received,inspecting,awaiting-signature', label: 'All open' },
  { value: 'accepted,rejected,mrb', label: 'Disposed' },
];

const STATUS_TONE: Record<LotStatus, 'pass' | 'fail' | 'hold' | 'info' | 'neutral'> = {
  received: 'neutral',
  inspecting: 'info',
  'awaiting-signature': 'hold',
  accepted: 'pass',
  rejected: 'fail',
  mrb: 'hold',
};

export function LotStatusTag({ status }: { status: LotStatus }) {
  return <StatusTag tone={STATUS_TONE[status]}>{status === 'mrb' ? 'MRB' : status.replace('-', ' ')}</StatusTag>;
}

/** Lots waiting at the bench, sorted and paged on the server; each code opens the lot's bench page. */
export function BenchQueueTable() {
  const [page, setPage] = useState(1);
  const [status, setStatus] = useState(FILTERS[0].value);
  const [search, setSearch] = useState('');
  const [sort, setSort] = useState<ServerSort | null>({ id: 'receivedAt', desc: false });
  const q = useBenchQueue({ page, pageSize: PAGE_SIZE, status, search, sort: sort?.id as BenchQueueSort | undefined, dir: sort?.desc ? 'desc' : 'asc' });

  const columns = useMemo<ColumnDef<BenchQueueRow, unknown>[]>(
    () => [
      {
        id: 'code',
        accessorKey: 'code',
        header: 'Lot',
        cell: ({ row }) => (
          <Link to={`/bench/lots/${row.original.id}`} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
            {row.original.code}
          </Link>
        ),
      },
      { id: 'partNumber', accessorKey: 'partNumber', header: 'Part', enableSorting: false },
      { id: 'supplierName', accessorKey: 'supplierName', header: 'Supplier', enableSorting: false },
      { id: 'quantity', accessorKey: 'quantity', header: 'Quantity', cell: ({ row }) => <span className="num">{row.original.quantity.toLocaleString()}</span> },
      { id: 'measured', accessorKey: 'measured', header: 'Measured', enableSorting: false, cell: ({ row }) => <span className="num">{row.original.measured.toLocaleString()}</span> },
      { id: 'status', accessorKey: 'status', header: 'Status', cell: ({ row }) => <LotStatusTag status={row.original.status} /> },
      { id: 'receivedAt', accessorKey: 'receivedAt', header: 'Received', cell: ({ row }) => <span className="num">{new Date(row.original.receivedAt).toLocaleString()}</span> },
    ],
    [],
  );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <div role="group" aria-label="Lots to show" className="flex overflow-hidden rounded-md border border-rule">
          {FILTERS.map((f) => (
            <button
              key={f.value}
              type="button"
              aria-pressed={status === f.value}
              onClick={() => {
                setStatus(f.value);
                setPage(1);
              }}
              className={`px-3 py-1.5 text-sm font-semibold ${status === f.value ? 'bg-slate-bar text-white' : 'bg-panel text-ink-soft hover:bg-paper'}`}
            >
              {f.label}
            </button>
          ))}
        </div>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Search
          <input
            type="search"
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              setPage(1);
            }}
            placeholder="Lot, part or supplier"
            className="w-64 rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
          />
        </label>
      </div>
      {q.isError ? (
        <Notice tone="fail" title="The queue could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Lots at the bench"
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
          getRowId={(r) => String(r.id)}
          empty={search ? 'No lot matches this search.' : 'No lots here. Lots appear once they are received at the Dock.'}
        />
      )}
    </div>
  );
}

import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { LOT_STATUSES, LOT_STATUS_LABELS, type LotRow, type LotStatus } from '../../../../shared/api/lots.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useLots } from '../api/get-lots.ts';
import { useReceivingOptions } from '../api/get-receiving-options.ts';
import { FloorLifeTag } from './floor-life-tag.tsx';
import { formatDateTime } from './format.ts';

const PAGE_SIZE = 15;

const STATUS_TONE: Record<LotStatus, 'neutral' | 'info' | 'hold' | 'pass' | 'fail'> = {
  received: 'neutral',
  inspecting: 'info',
  'awaiting-signature': 'hold',
  accepted: 'pass',
  rejected: 'fail',
  mrb: 'hold',
};

export function LotStatusTag({ status }: { status: LotStatus }) {
  return <StatusTag tone={STATUS_TONE[status]}>{LOT_STATUS_LABELS[status]}</StatusTag>;
}

const filterControl = 'rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink';
const filterLabel = 'flex flex-col gap-1 text-sm font-semibold text-ink-soft';

/** Received lots, filtered, sorted and paged on the server, with their floor-life state. */
export function LotsTable({ lotHref }: { lotHref: (id: number) => string }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'receivedAt', desc: true });
  const [filters, setFilters] = useState({ status: '' as LotStatus | '', supplierId: '', partTypeId: '', receivedFrom: '', receivedTo: '', search: '' });
  const options = useReceivingOptions();
  const q = useLots({
    page,
    pageSize: PAGE_SIZE,
    status: filters.status,
    supplierId: filters.supplierId ? Number(filters.supplierId) : '',
    partTypeId: filters.partTypeId ? Number(filters.partTypeId) : '',
    receivedFrom: filters.receivedFrom || undefined,
    receivedTo: filters.receivedTo || undefined,
    search: filters.search.trim() || undefined,
    sort: sort?.id,
    dir: sort ? (sort.desc ? 'desc' : 'asc') : undefined,
  });
  const setFilter = (k: keyof typeof filters) => (e: { target: { value: string } }) => {
    setFilters((f) => ({ ...f, [k]: e.target.value }));
    setPage(1);
  };

  const columns = useMemo<ColumnDef<LotRow, unknown>[]>(
    () => [
      {
        id: 'code',
        accessorFn: (r) => r.code,
        header: 'Lot',
        enableSorting: true,
        cell: ({ row }) => (
          <Link to={lotHref(row.original.id)} className="font-mono font-semibold text-copper-dark underline-offset-2 hover:underline">
            {row.original.code}
          </Link>
        ),
      },
      { id: 'receivedAt', accessorFn: (r) => r.receivedAt, header: 'Received', enableSorting: true, cell: ({ row }) => <span className="num whitespace-nowrap">{formatDateTime(row.original.receivedAt)}</span> },
      { id: 'supplier', accessorFn: (r) => r.supplier.name, header: 'Supplier', enableSorting: true, cell: ({ row }) => row.original.supplier.name },
      { id: 'partNumber', accessorFn: (r) => r.partType.partNumber, header: 'Part', enableSorting: true, cell: ({ row }) => <span className="font-mono">{row.original.partType.partNumber}</span> },
      { id: 'quantity', accessorFn: (r) => r.quantity, header: 'Qty', enableSorting: true, cell: ({ row }) => <span className="num">{row.original.quantity.toLocaleString()}</span> },
      { id: 'purchaseOrder', header: 'PO', enableSorting: false, cell: ({ row }) => row.original.purchaseOrder ?? '—' },
      { id: 'supplierLot', header: 'Supplier lot', enableSorting: false, cell: ({ row }) => row.original.supplierLot ?? '—' },
      { id: 'dateCode', header: 'DC', enableSorting: false, cell: ({ row }) => row.original.dateCode ?? '—' },
      { id: 'status', accessorFn: (r) => r.status, header: 'Status', enableSorting: true, cell: ({ row }) => <LotStatusTag status={row.original.status} /> },
      { id: 'floorLife', header: 'Floor life', enableSorting: false, cell: ({ row }) => <FloorLifeTag floorLife={row.original.floorLife} /> },
    ],
    [lotHref],
  );

  const err = q.error instanceof ApiError ? q.error : null;
  const filtered = Object.values(filters).some(Boolean);
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter lots">
        <label className={filterLabel}>
          Search
          <input type="search" value={filters.search} onChange={setFilter('search')} placeholder="Lot code, PO or supplier lot" className={`${filterControl} w-60`} />
        </label>
        <label className={filterLabel}>
          Status
          <select value={filters.status} onChange={setFilter('status')} className={filterControl}>
            <option value="">All</option>
            {LOT_STATUSES.map((s) => (
              <option key={s} value={s}>
                {LOT_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </label>
        <label className={filterLabel}>
          Supplier
          <select value={filters.supplierId} onChange={setFilter('supplierId')} className={`${filterControl} max-w-56`}>
            <option value="">All</option>
            {options.data?.suppliers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <label className={filterLabel}>
          Part
          <select value={filters.partTypeId} onChange={setFilter('partTypeId')} className={`${filterControl} max-w-48`}>
            <option value="">All</option>
            {options.data?.partTypes.map((p) => (
              <option key={p.id} value={p.id}>
                {p.partNumber}
              </option>
            ))}
          </select>
        </label>
        <label className={filterLabel}>
          Received from
          <input type="date" value={filters.receivedFrom} onChange={setFilter('receivedFrom')} className={filterControl} />
        </label>
        <label className={filterLabel}>
          to
          <input type="date" value={filters.receivedTo} onChange={setFilter('receivedTo')} className={filterControl} />
        </label>
      </div>
      {err ? (
        <Notice tone="fail" title="Lots could not be loaded">
          {err.problem.detail}
        </Notice>
      ) : (
        <DataTable
          caption="Received lots"
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
          getRowId={(l) => String(l.id)}
          empty={filtered ? 'No lot matches these filters.' : 'No lots received yet. Scan a supplier label above to receive the first one.'}
        />
      )}
    </div>
  );
}

import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { NCR_STATUS_LABELS, NCR_STATUSES, type NcrRow, type NcrSort, type NcrStatus } from '../../../../shared/api/supplier-quality.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { useNcrs } from '../api/get-ncrs.ts';
import { NcrStatusTag } from './ncr-status-tag.tsx';

const PAGE_SIZE = 20;
const SORTABLE = new Set(['code', 'createdAt', 'dueDate', 'status', 'supplierName']);

/** Nonconformance reports; filtered, sorted and paged on the server. */
export function NcrsTable({ detailPath }: { detailPath: (id: number) => string }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'createdAt', desc: true });
  const [status, setStatus] = useState<NcrStatus | ''>('');
  const q = useNcrs({ page, pageSize: PAGE_SIZE, status: status || undefined, sort: sort?.id as NcrSort | undefined, dir: sort?.desc ? 'desc' : 'asc' });
  const columns = useMemo<ColumnDef<NcrRow, unknown>[]>(
    () =>
      [
        {
          id: 'code',
          header: 'NCR',
          cell: ({ row }: { row: { original: NcrRow } }) => (
            <Link to={detailPath(row.original.id)} className="num font-semibold text-copper-dark underline-offset-2 hover:underline">
              {row.original.code}
            </Link>
          ),
        },
        { id: 'supplierName', header: 'Supplier', cell: ({ row }: { row: { original: NcrRow } }) => row.original.supplier.name },
        { id: 'part', header: 'Part', cell: ({ row }: { row: { original: NcrRow } }) => <span className="num">{row.original.partType.partNumber}</span> },
        { id: 'lot', header: 'Lot', cell: ({ row }: { row: { original: NcrRow } }) => <span className="num">{row.original.lot.code}</span> },
        {
          id: 'status',
          header: 'Status',
          cell: ({ row }: { row: { original: NcrRow } }) => (
            <span className="flex gap-1">
              <NcrStatusTag status={row.original.status} />
              {row.original.overdue && <StatusTag tone="fail">Overdue</StatusTag>}
            </span>
          ),
        },
        { id: 'dueDate', header: 'Answer due', cell: ({ row }: { row: { original: NcrRow } }) => <span className="num">{row.original.dueDate}</span> },
        { id: 'createdAt', header: 'Raised', cell: ({ row }: { row: { original: NcrRow } }) => <span className="num">{new Date(row.original.createdAt).toLocaleDateString()}</span> },
      ].map((c) => ({ ...c, enableSorting: SORTABLE.has(c.id) })),
    [detailPath],
  );
  return (
    <div className="flex flex-col gap-3">
      <label className="flex w-48 flex-col gap-1 text-sm font-semibold text-ink-soft">
        Status
        <select
          value={status}
          onChange={(e) => {
            setStatus(e.target.value as NcrStatus | '');
            setPage(1);
          }}
          className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
        >
          <option value="">Any status</option>
          {NCR_STATUSES.map((s) => (
            <option key={s} value={s}>
              {NCR_STATUS_LABELS[s]}
            </option>
          ))}
        </select>
      </label>
      {q.isError ? (
        <Notice tone="fail" title="The NCRs could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Nonconformance reports"
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
          empty={status ? 'No NCR with this status.' : 'No NCR yet. Raise one from a rejected lot on a scorecard, or from a drift alert.'}
        />
      )}
    </div>
  );
}

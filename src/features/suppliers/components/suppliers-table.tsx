import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { APPROVAL_LABELS, APPROVAL_STATUSES, type ApprovalStatus, type SupplierRow, type SupplierSort } from '../../../../shared/api/catalog.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { useDebounced } from '../../../lib/use-debounced.ts';
import { useSuppliers } from '../api/get-suppliers.ts';
import { ApprovalTag } from './approval-tag.tsx';

const PAGE_SIZE = 20;
const filterControl = 'rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink';

/** Suppliers with their approval status; sorting, filtering and paging on the server. */
export function SuppliersTable({ detailPath }: { detailPath: (id: number) => string }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'name', desc: false });
  const [search, setSearch] = useState('');
  const [approval, setApproval] = useState<ApprovalStatus | ''>('');
  const debounced = useDebounced(search, 250);
  const q = useSuppliers({ page, pageSize: PAGE_SIZE, search: debounced, approval, sort: sort?.id as SupplierSort | undefined, dir: sort?.desc ? 'desc' : 'asc' });

  const columns = useMemo<ColumnDef<SupplierRow, unknown>[]>(
    () => [
      { id: 'code', accessorKey: 'code', header: 'Code', enableSorting: true, cell: ({ row }) => <span className="num font-semibold">{row.original.code}</span> },
      {
        id: 'name',
        accessorKey: 'name',
        header: 'Name',
        enableSorting: true,
        cell: ({ row }) => (
          <Link to={detailPath(row.original.id)} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
            {row.original.name}
          </Link>
        ),
      },
      { id: 'approval', accessorKey: 'approval', header: 'Approval', enableSorting: true, cell: ({ row }) => <ApprovalTag approval={row.original.approval} /> },
      { id: 'contacts', header: 'Contacts', enableSorting: false, cell: ({ row }) => <span className="num">{row.original.contactCount}</span> },
      { id: 'parts', header: 'Part numbers', enableSorting: false, cell: ({ row }) => <span className="num">{row.original.partCount}</span> },
      {
        id: 'updatedAt',
        accessorKey: 'updatedAt',
        header: 'Changed',
        enableSorting: true,
        cell: ({ row }) => <span className="num">{new Date(row.original.updatedAt).toLocaleDateString()}</span>,
      },
    ],
    [detailPath],
  );

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter suppliers">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Search
          <input
            type="search"
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              setPage(1);
            }}
            placeholder="Name or code"
            className={`w-64 ${filterControl}`}
          />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Approval
          <select
            value={approval}
            onChange={(e) => {
              setApproval(e.target.value as ApprovalStatus | '');
              setPage(1);
            }}
            className={filterControl}
          >
            <option value="">Any approval</option>
            {APPROVAL_STATUSES.map((a) => (
              <option key={a} value={a}>
                {APPROVAL_LABELS[a]}
              </option>
            ))}
          </select>
        </label>
      </div>
      {q.isError ? (
        <Notice tone="fail" title="Suppliers could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Suppliers"
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
          getRowId={(s) => String(s.id)}
          empty={search || approval ? 'No supplier matches these filters.' : 'No suppliers yet.'}
        />
      )}
    </div>
  );
}

import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { KIT_STATUSES, type KitRow, type KitSort, type KitStatus } from '../../../../shared/api/pairing.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { useDebounced } from '../../../lib/use-debounced.ts';
import { useKits } from '../api/get-kits.ts';
import { filterControl, filterLabel, formatDateTime, kitStatusLabel, modeText, setsText } from './format.ts';
import { KitStatusTag } from './kit-status-tag.tsx';

const PAGE_SIZE = 15;

/** Kits filtered, sorted and paged on the server, newest first. */
export function KitsTable({ kitHref }: { kitHref: (id: number) => string }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'createdAt', desc: true });
  const [status, setStatus] = useState<KitStatus | ''>('');
  const [search, setSearch] = useState('');
  const debounced = useDebounced(search.trim(), 250);
  const q = useKits({
    page,
    pageSize: PAGE_SIZE,
    status: status || undefined,
    search: debounced || undefined,
    sort: sort?.id as KitSort | undefined,
    dir: sort ? (sort.desc ? 'desc' : 'asc') : undefined,
  });
  const columns: ColumnDef<KitRow, unknown>[] = [
    {
      id: 'code',
      header: 'Kit',
      enableSorting: true,
      cell: ({ row }) => (
        <Link to={kitHref(row.original.id)} className="font-mono font-semibold text-ink underline-offset-2 hover:underline">
          {row.original.code}
        </Link>
      ),
    },
    { id: 'status', header: 'Status', enableSorting: true, cell: ({ row }) => <KitStatusTag status={row.original.status} /> },
    {
      id: 'what',
      header: 'Sets',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="text-sm">
          <span className="font-semibold">{row.original.partNumbers.join(' + ')}</span>{' '}
          <span className="text-ink-soft">
            {setsText(row.original.setsWanted, row.original.setSize)}, {modeText(row.original.mode)}
          </span>
        </span>
      ),
    },
    {
      id: 'pulled',
      header: 'Pulled',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="num">
          {row.original.pulled} of {row.original.parts}
        </span>
      ),
    },
    { id: 'reservedUntil', header: 'Reserved until', enableSorting: true, cell: ({ row }) => <span className="num">{row.original.reservedUntil ? formatDateTime(row.original.reservedUntil) : '—'}</span> },
    {
      id: 'createdAt',
      header: 'Requested',
      enableSorting: true,
      cell: ({ row }) => (
        <span className="num text-sm">
          {formatDateTime(row.original.createdAt)} <span className="text-ink-soft">· {row.original.createdByName}</span>
        </span>
      ),
    },
  ];
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className={filterLabel}>
          Status
          <select
            className={filterControl}
            value={status}
            onChange={(e) => {
              setStatus(e.target.value as KitStatus | '');
              setPage(1);
            }}
          >
            <option value="">Any status</option>
            {KIT_STATUSES.filter((s) => s !== 'planned').map((s) => (
              <option key={s} value={s}>
                {kitStatusLabel(s)}
              </option>
            ))}
          </select>
        </label>
        <label className={filterLabel}>
          Search
          <input
            type="search"
            className={`${filterControl} w-56`}
            value={search}
            onChange={(e) => {
              setSearch(e.target.value);
              setPage(1);
            }}
            placeholder="Kit code or part number"
          />
        </label>
      </div>
      {q.isError ? (
        <Notice tone="fail" title="Kits could not be loaded">
          {(q.error as Error).message}
        </Notice>
      ) : (
        <DataTable
          caption="Kits"
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
          loading={q.isLoading || q.isFetching}
          getRowId={(r) => String(r.id)}
          empty={status || debounced ? 'No kit matches these filters.' : 'No kits yet. Plan a request above and reserve it.'}
        />
      )}
    </div>
  );
}

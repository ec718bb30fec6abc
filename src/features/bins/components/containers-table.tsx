import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { CONTAINER_KIND_LABELS, CONTAINER_STATUSES, OUTSIDE_BINS_CODE, type ContainerRow, type ContainerSort, type ContainerStatus } from '../../../../shared/api/bins.ts';
import { Button } from '../../../components/ui/button.tsx';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { useContainers } from '../api/get-containers.ts';
import { BinChip } from './bin-chip.tsx';
import { ContainerActionDialog, type ContainerAction } from './container-action-dialog.tsx';
import { ContainerStatusTag } from './container-status-tag.tsx';
import { filterControl, filterLabel, formatDate, statusLabel } from './format.ts';
import { PrintLabelsPanel } from './print-labels-panel.tsx';

const PAGE_SIZE = 20;

export interface ContainersTableProps {
  canEdit: boolean;
  containerHref: (id: number) => string;
  /** Part types to filter by (those with containers). */
  partTypes: { id: number; partNumber: string }[];
  /** Fixed filters, e.g. one lot. */
  lotId?: number;
  initialPartTypeId?: number;
}

/**
 * Containers filtered, sorted and paged on the server, with move / adjust / scrap / close per
 * row and a selection that carries across pages for printing bin labels.
 */
export function ContainersTable({ canEdit, containerHref, partTypes, lotId, initialPartTypeId }: ContainersTableProps) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'createdAt', desc: true });
  const [filters, setFilters] = useState({ partTypeId: initialPartTypeId ? String(initialPartTypeId) : '', bin: '', status: '' as ContainerStatus | '', location: '', search: '' });
  const [selected, setSelected] = useState<Map<number, ContainerRow>>(new Map());
  const [acting, setActing] = useState<{ row: ContainerRow; action: ContainerAction } | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const q = useContainers({
    page,
    pageSize: PAGE_SIZE,
    lotId,
    partTypeId: filters.partTypeId ? Number(filters.partTypeId) : undefined,
    bin: filters.bin.trim() || undefined,
    status: filters.status || undefined,
    location: filters.location.trim() || undefined,
    search: filters.search.trim() || undefined,
    sort: sort?.id as ContainerSort | undefined,
    dir: sort ? (sort.desc ? 'desc' : 'asc') : undefined,
  });
  const setFilter = (k: keyof typeof filters) => (e: { target: { value: string } }) => {
    setFilters((f) => ({ ...f, [k]: e.target.value }));
    setPage(1);
  };
  const rows = q.data?.items ?? [];
  const allOnPage = rows.length > 0 && rows.every((r) => selected.has(r.id));
  const toggle = (r: ContainerRow) =>
    setSelected((s) => {
      const n = new Map(s);
      if (n.has(r.id)) n.delete(r.id);
      else n.set(r.id, r);
      return n;
    });
  const togglePage = () =>
    setSelected((s) => {
      const n = new Map(s);
      for (const r of rows) {
        if (allOnPage) n.delete(r.id);
        else n.set(r.id, r);
      }
      return n;
    });

  const columns: ColumnDef<ContainerRow, unknown>[] = [
    {
      id: 'select',
      header: () => <input type="checkbox" aria-label="Select all containers on this page" checked={allOnPage} onChange={togglePage} />,
      enableSorting: false,
      cell: ({ row }) => <input type="checkbox" aria-label={`Select ${row.original.code}`} checked={selected.has(row.original.id)} onChange={() => toggle(row.original)} />,
    },
    {
      id: 'code',
      header: 'Container',
      enableSorting: true,
      cell: ({ row }) => (
        <Link to={containerHref(row.original.id)} className="font-mono font-semibold text-ink underline-offset-2 hover:underline">
          {row.original.code}
        </Link>
      ),
    },
    { id: 'bin', header: 'Bin', enableSorting: true, cell: ({ row }) => <BinChip bin={row.original.bin} /> },
    {
      id: 'part',
      header: 'Part · lot',
      enableSorting: false,
      cell: ({ row }) => (
        <span className="text-sm">
          <span className="font-semibold">{row.original.partNumber}</span> <span className="font-mono text-ink-soft">{row.original.lotCode}</span>
        </span>
      ),
    },
    {
      id: 'quantity',
      header: 'Qty',
      enableSorting: true,
      cell: ({ row }) => (
        <span className="num">
          {row.original.quantity} / {row.original.capacity}
        </span>
      ),
    },
    { id: 'location', header: 'Location', enableSorting: true, cell: ({ row }) => row.original.location },
    { id: 'status', header: 'Status', enableSorting: true, cell: ({ row }) => <ContainerStatusTag status={row.original.status} /> },
    {
      id: 'kind',
      header: 'Kind',
      enableSorting: false,
      cell: ({ row }) => `${CONTAINER_KIND_LABELS[row.original.kind]}${row.original.hasPositions ? ', numbered' : ''}`,
    },
    { id: 'createdAt', header: 'Opened', enableSorting: true, cell: ({ row }) => <span className="num">{formatDate(row.original.createdAt)}</span> },
    {
      id: 'actions',
      header: '',
      enableSorting: false,
      cell: ({ row }) =>
        canEdit ? (
          <span className="flex gap-1">
            <Button variant="quiet" onClick={() => setActing({ row: row.original, action: 'move' })} aria-label={`Move ${row.original.code}`}>
              Move
            </Button>
            {!row.original.hasPositions && (
              <Button variant="quiet" onClick={() => setActing({ row: row.original, action: 'adjust' })} aria-label={`Adjust ${row.original.code}`}>
                Adjust
              </Button>
            )}
            <Button variant="quiet" disabled={row.original.quantity === 0} onClick={() => setActing({ row: row.original, action: 'scrap' })} aria-label={`Scrap from ${row.original.code}`}>
              Scrap
            </Button>
          </span>
        ) : null,
    },
  ];

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        {lotId === undefined && (
          <label className={filterLabel}>
            Part type
            <select className={filterControl} value={filters.partTypeId} onChange={setFilter('partTypeId')}>
              <option value="">All part types</option>
              {partTypes.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.partNumber}
                </option>
              ))}
            </select>
          </label>
        )}
        <label className={filterLabel}>
          Bin
          <input className={`${filterControl} w-24`} value={filters.bin} onChange={setFilter('bin')} placeholder={`A or ${OUTSIDE_BINS_CODE}`} />
        </label>
        <label className={filterLabel}>
          Status
          <select className={filterControl} value={filters.status} onChange={setFilter('status')}>
            <option value="">Any status</option>
            {CONTAINER_STATUSES.map((s) => (
              <option key={s} value={s}>
                {statusLabel(s)}
              </option>
            ))}
          </select>
        </label>
        <label className={filterLabel}>
          Location
          <input className={`${filterControl} w-36`} value={filters.location} onChange={setFilter('location')} placeholder="Rack, shelf…" />
        </label>
        <label className={filterLabel}>
          Search
          <input type="search" className={`${filterControl} w-56`} value={filters.search} onChange={setFilter('search')} placeholder="Container, lot or part" />
        </label>
      </div>
      {done && <Notice tone="pass">{done}</Notice>}
      {q.isError ? (
        <Notice tone="fail" title="Containers could not be loaded">
          {(q.error as Error).message}
        </Notice>
      ) : (
        <DataTable
          caption="Containers"
          columns={columns}
          rows={rows}
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
          empty={Object.values(filters).some(Boolean) ? 'No container matches these filters.' : 'No containers yet: they open when a lot is screened into bins.'}
        />
      )}
      {canEdit && (
        <div className="rounded-lg border border-rule bg-paper p-3">
          <p className="mb-2 text-sm font-semibold text-ink">
            {selected.size === 0 ? 'Select containers to print their bin labels.' : `${selected.size} container${selected.size === 1 ? '' : 's'} selected: ${[...selected.values()].map((c) => c.code).slice(0, 4).join(', ')}${selected.size > 4 ? ' …' : ''}`}
            {selected.size > 0 && (
              <Button variant="quiet" className="ml-2" onClick={() => setSelected(new Map())}>
                Clear
              </Button>
            )}
          </p>
          <PrintLabelsPanel containerIds={[...selected.keys()]} />
        </div>
      )}
      {acting && <ContainerActionDialog container={acting.row} action={acting.action} onClose={() => setActing(null)} onDone={setDone} />}
    </div>
  );
}

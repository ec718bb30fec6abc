import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ColumnDef } from '@tanstack/react-table';
import { POLARITIES, type PartTypeRow, type PartTypeSort, type Polarity } from '../../../../shared/api/catalog.ts';
import { DataTable, type ServerSort } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { useDebounced } from '../../../lib/use-debounced.ts';
import { usePackages } from '../api/get-packages.ts';
import { usePartTypes } from '../api/get-part-types.ts';
import { mslLabel } from '../lib/part-type-options.ts';

const PAGE_SIZE = 20;
const limits = (min: number | null, max: number | null, unit = '') =>
  min === null && max === null ? '—' : `${min ?? '…'}–${max ?? '…'}${unit}`;

const filterControl = 'rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink';

/** The catalog's part types: filters, server-side sorting and paging. */
export function PartTypesTable({ detailPath }: { detailPath: (id: number) => string }) {
  const [page, setPage] = useState(1);
  const [sort, setSort] = useState<ServerSort | null>({ id: 'partNumber', desc: false });
  const [search, setSearch] = useState('');
  const [polarity, setPolarity] = useState<Polarity | ''>('');
  const [pkg, setPkg] = useState('');
  const [active, setActive] = useState<'true' | 'false' | ''>('true');
  const debouncedSearch = useDebounced(search, 250);
  const packages = usePackages();
  const q = usePartTypes({
    page,
    pageSize: PAGE_SIZE,
    search: debouncedSearch,
    polarity,
    package: pkg,
    active,
    sort: sort?.id as PartTypeSort | undefined,
    dir: sort?.desc ? 'desc' : 'asc',
  });

  const columns = useMemo<ColumnDef<PartTypeRow, unknown>[]>(
    () => [
      {
        id: 'partNumber',
        accessorKey: 'partNumber',
        header: 'Part number',
        enableSorting: true,
        cell: ({ row }) => (
          <Link to={detailPath(row.original.id)} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
            {row.original.partNumber}
          </Link>
        ),
      },
      { id: 'description', accessorKey: 'description', header: 'Description', enableSorting: true },
      { id: 'polarity', accessorKey: 'polarity', header: 'Type', enableSorting: true },
      { id: 'packageName', accessorKey: 'packageName', header: 'Package', enableSorting: true },
      {
        id: 'hfeIcMa',
        accessorKey: 'hfeIcMa',
        header: () => <span className="normal-case">hFE test</span>,
        enableSorting: true,
        cell: ({ row }) => <span className="num whitespace-nowrap">{`${row.original.hfeIcMa} mA, ${row.original.hfeVceV} V`}</span>,
      },
      { id: 'hfeMin', accessorKey: 'hfeMin', header: () => <span className="normal-case">hFE min</span>, enableSorting: true, cell: ({ row }) => <span className="num">{row.original.hfeMin ?? '—'}</span> },
      { id: 'hfeMax', accessorKey: 'hfeMax', header: () => <span className="normal-case">hFE max</span>, enableSorting: true, cell: ({ row }) => <span className="num">{row.original.hfeMax ?? '—'}</span> },
      {
        id: 'vbeMinMv',
        accessorKey: 'vbeMinMv',
        header: () => <span className="normal-case">Vbe (mV)</span>,
        enableSorting: true,
        cell: ({ row }) => <span className="num whitespace-nowrap">{limits(row.original.vbeMinMv, row.original.vbeMaxMv)}</span>,
      },
      { id: 'msl', accessorKey: 'msl', header: 'MSL', enableSorting: true, cell: ({ row }) => <span className="whitespace-nowrap">{mslLabel(row.original.msl)}</span> },
      { id: 'esdHbmClass', accessorKey: 'esdHbmClass', header: 'ESD', enableSorting: true, cell: ({ row }) => row.original.esdHbmClass ?? '—' },
      {
        id: 'aql',
        accessorKey: 'aql',
        header: 'AQL',
        enableSorting: true,
        cell: ({ row }) => <span className="num whitespace-nowrap">{`${row.original.aql} % · ${row.original.inspectionLevel}`}</span>,
      },
      {
        id: 'scheme',
        header: 'Bins',
        enableSorting: false,
        cell: ({ row }) => (row.original.currentSchemeVersion === null ? <span className="text-ink-faint">none</span> : <span className="num">v{row.original.currentSchemeVersion}</span>),
      },
      {
        id: 'active',
        accessorKey: 'active',
        header: 'Status',
        enableSorting: true,
        cell: ({ row }) => (row.original.active ? <StatusTag tone="pass">Active</StatusTag> : <StatusTag tone="neutral">Inactive</StatusTag>),
      },
    ],
    [detailPath],
  );

  const reset = <T,>(setter: (v: T) => void) => (v: T) => {
    setter(v);
    setPage(1);
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter part types">
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Search
          <input type="search" value={search} onChange={(e) => reset(setSearch)(e.target.value)} placeholder="Part number or description" className={`w-64 ${filterControl}`} />
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Polarity
          <select value={polarity} onChange={(e) => reset(setPolarity)(e.target.value as Polarity | '')} className={filterControl}>
            <option value="">NPN and PNP</option>
            {POLARITIES.map((p) => (
              <option key={p} value={p}>
                {p}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Package
          <select value={pkg} onChange={(e) => reset(setPkg)(e.target.value)} className={filterControl}>
            <option value="">All packages</option>
            {(packages.data ?? []).map((p) => (
              <option key={p} value={p}>
                {p}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
          Status
          <select value={active} onChange={(e) => reset(setActive)(e.target.value as 'true' | 'false' | '')} className={filterControl}>
            <option value="true">Active</option>
            <option value="false">Inactive</option>
            <option value="">All</option>
          </select>
        </label>
      </div>
      {q.isError ? (
        <Notice tone="fail" title="Part types could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Part types"
          columns={columns}
          rows={q.data?.items ?? []}
          total={q.data?.total ?? 0}
          page={page}
          pageSize={PAGE_SIZE}
          sort={sort}
          onSortChange={(next) => {
            setSort(next);
            setPage(1);
          }}
          onPageChange={setPage}
          loading={q.isLoading}
          getRowId={(p) => String(p.id)}
          empty={search || polarity || pkg || active !== 'true' ? 'No part type matches these filters.' : 'No part types yet.'}
        />
      )}
    </div>
  );
}

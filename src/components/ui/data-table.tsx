import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import { Button } from './button.tsx';
import { ScrollBox } from './scroll-box.tsx';

export interface ServerSort {
  id: string;
  desc: boolean;
}

interface DataTableProps<T> {
  columns: ColumnDef<T, unknown>[];
  rows: T[];
  total: number;
  page: number;
  pageSize: number;
  sort: ServerSort | null;
  onSortChange: (sort: ServerSort | null) => void;
  onPageChange: (page: number) => void;
  loading?: boolean;
  caption: string;
  empty?: React.ReactNode;
  getRowId?: (row: T) => string;
}

/**
 * A dense table whose sorting and paging happen on the server (TanStack Table in manual mode).
 * Sortable headers are buttons, so the table works from the keyboard.
 */
export function DataTable<T>({
  columns,
  rows,
  total,
  page,
  pageSize,
  sort,
  onSortChange,
  onPageChange,
  loading,
  caption,
  empty,
  getRowId,
}: DataTableProps<T>) {
  const sorting: SortingState = sort ? [sort] : [];
  // The table object is rebuilt each render on purpose; React Compiler cannot memoise it.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    manualSorting: true,
    manualPagination: true,
    pageCount: Math.max(1, Math.ceil(total / pageSize)),
    getRowId,
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      onSortChange(next[0] ? { id: next[0].id, desc: next[0].desc } : null);
    },
    getCoreRowModel: getCoreRowModel(),
  });
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const from = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const to = Math.min(total, page * pageSize);

  return (
    <div className="overflow-hidden rounded-lg border border-rule bg-panel">
      <ScrollBox label={caption}>
        {/* At least 40rem wide: on a phone the table scrolls sideways instead of breaking codes over lines. */}
        <table className="w-full min-w-[40rem] border-collapse text-sm" aria-busy={loading || undefined}>
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-paper text-left">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const canSort = h.column.getCanSort();
                  const dir = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : undefined}
                      className="border-b border-rule px-3 py-2 text-xs font-bold uppercase tracking-wide text-ink-soft"
                    >
                      {canSort ? (
                        <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden className="text-ink-faint">{dir === 'asc' ? '▲' : dir === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-b border-rule/70 last:border-b-0 hover:bg-copper-light/40">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-1.5 align-middle">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollBox>
      {rows.length === 0 && !loading && <div className="px-4 py-8 text-center text-sm text-ink-soft">{empty ?? 'Nothing to show.'}</div>}
      <div className="flex items-center justify-between gap-3 border-t border-rule bg-paper px-3 py-2 text-xs text-ink-soft">
        <span className="num">
          {loading ? 'Loading…' : `${from}–${to} of ${total}`}
        </span>
        <div className="flex items-center gap-2">
          <Button variant="quiet" onClick={() => onPageChange(page - 1)} disabled={page <= 1} aria-label="Previous page">
            ‹ Previous
          </Button>
          <span className="num">
            Page {page} of {pages}
          </span>
          <Button variant="quiet" onClick={() => onPageChange(page + 1)} disabled={page >= pages} aria-label="Next page">
            Next ›
          </Button>
        </div>
      </div>
    </div>
  );
}

import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { AuditRow } from '../../../../shared/api/users.ts';
import { DataTable } from '../../../components/ui/data-table.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { useAudit } from '../api/get-audit.ts';

const PAGE_SIZE = 30;

function diff(before: AuditRow['before'], after: AuditRow['after']): string {
  if (!before && after) return Object.entries(after).map(([k, v]) => `${k}: ${JSON.stringify(v)}`).join(', ');
  if (!before || !after) return '';
  return Object.keys({ ...before, ...after })
    .filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]))
    .map((k) => `${k}: ${JSON.stringify(before[k])} → ${JSON.stringify(after[k])}`)
    .join(', ');
}

/** The append-only audit trail, newest first. */
export function AuditTable() {
  const [page, setPage] = useState(1);
  const [entityType, setEntityType] = useState('');
  const q = useAudit({ page, pageSize: PAGE_SIZE, entityType: entityType || undefined });
  const columns = useMemo<ColumnDef<AuditRow, unknown>[]>(
    () => [
      { id: 'at', header: 'When', cell: ({ row }) => <span className="num whitespace-nowrap">{new Date(row.original.at).toLocaleString()}</span> },
      { id: 'actor', header: 'Who', accessorKey: 'actorName' },
      { id: 'action', header: 'What', cell: ({ row }) => <code className="text-xs">{row.original.action}</code> },
      { id: 'record', header: 'Record', cell: ({ row }) => `${row.original.entityType} #${row.original.entityId}` },
      { id: 'change', header: 'Change', cell: ({ row }) => <span className="text-xs text-ink-soft">{diff(row.original.before, row.original.after)}{row.original.note ? ` — ${row.original.note}` : ''}</span> },
    ],
    [],
  );
  return (
    <div className="flex flex-col gap-3">
      <label className="flex w-64 flex-col gap-1 text-sm font-semibold text-ink-soft">
        Record type
        <input
          value={entityType}
          onChange={(e) => {
            setEntityType(e.target.value.trim());
            setPage(1);
          }}
          placeholder="e.g. user"
          className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
        />
      </label>
      {q.isError ? (
        <Notice tone="fail" title="The audit trail could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Audit trail"
          columns={columns.map((c) => ({ ...c, enableSorting: false }))}
          rows={q.data?.items ?? []}
          total={q.data?.total ?? 0}
          page={page}
          pageSize={PAGE_SIZE}
          sort={null}
          onSortChange={() => {}}
          onPageChange={setPage}
          loading={q.isLoading}
          getRowId={(r) => r.id}
          empty="No changes recorded yet."
        />
      )}
    </div>
  );
}

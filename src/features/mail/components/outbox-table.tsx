import { useMemo, useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { OutboxRow } from '../../../../shared/api/mail.ts';
import { Button } from '../../../components/ui/button.tsx';
import { DataTable } from '../../../components/ui/data-table.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { OUTBOX_PAGE_SIZE, useOutbox } from '../api/get-outbox.ts';
import { useRetryMail } from '../api/retry-mail.ts';

const STATUS_TAG = {
  sent: <StatusTag tone="pass">Sent</StatusTag>,
  queued: <StatusTag tone="info">Waiting</StatusTag>,
  failed: <StatusTag tone="fail">Failed — will retry</StatusTag>,
};

/** Messages Binwright has sent or is trying to send. A failed send stays here until it goes through. */
export function OutboxTable() {
  const [page, setPage] = useState(1);
  const [status, setStatus] = useState('');
  const q = useOutbox({ page, status: status || undefined });
  const retry = useRetryMail();
  const columns = useMemo<ColumnDef<OutboxRow, unknown>[]>(
    () => [
      { id: 'created', header: 'Queued', cell: ({ row }) => <span className="num whitespace-nowrap">{new Date(row.original.createdAt).toLocaleString()}</span> },
      { id: 'to', header: 'To', accessorKey: 'to' },
      { id: 'subject', header: 'Subject', accessorKey: 'subject' },
      {
        id: 'attachments',
        header: 'Attachments',
        cell: ({ row }) => (
          <ul>
            {row.original.attachments.map((a) => (
              <li key={a.id}>
                <a className="text-copper-dark underline" href={`/api/mail/outbox/${row.original.id}/attachments/${a.id}`}>
                  {a.filename}
                </a>{' '}
                <span className="text-xs text-ink-faint">{Math.ceil(a.size / 1024)} kB</span>
              </li>
            ))}
          </ul>
        ),
      },
      {
        id: 'status',
        header: 'Status',
        cell: ({ row }) => (
          <div className="flex flex-col gap-0.5">
            {STATUS_TAG[row.original.status]}
            {row.original.status === 'sent' && row.original.sentAt && <span className="text-xs text-ink-faint">{new Date(row.original.sentAt).toLocaleString()}</span>}
            {row.original.status === 'failed' && (
              <span className="text-xs text-ink-soft" title={row.original.lastError ?? ''}>
                {row.original.attempts} attempt{row.original.attempts === 1 ? '' : 's'}; next {new Date(row.original.nextAttemptAt).toLocaleTimeString()}
              </span>
            )}
          </div>
        ),
      },
      {
        id: 'actions',
        header: '',
        cell: ({ row }) =>
          row.original.status === 'failed' ? (
            <Button variant="quiet" busy={retry.isPending && retry.variables === row.original.id} onClick={() => retry.mutate(row.original.id)}>
              Retry now
            </Button>
          ) : null,
      },
    ],
    [retry],
  );
  return (
    <div className="flex flex-col gap-3">
      <label className="flex w-48 flex-col gap-1 text-sm font-semibold text-ink-soft">
        Status
        <select
          value={status}
          onChange={(e) => {
            setStatus(e.target.value);
            setPage(1);
          }}
          className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
        >
          <option value="">All</option>
          <option value="queued">Waiting</option>
          <option value="failed">Failed</option>
          <option value="sent">Sent</option>
        </select>
      </label>
      {retry.isError && <Notice tone="fail">{(retry.error as Error).message}</Notice>}
      {q.isError ? (
        <Notice tone="fail" title="The outbox could not be loaded">{(q.error as Error).message}</Notice>
      ) : (
        <DataTable
          caption="Outgoing mail"
          columns={columns.map((c) => ({ ...c, enableSorting: false }))}
          rows={q.data?.items ?? []}
          total={q.data?.total ?? 0}
          page={page}
          pageSize={OUTBOX_PAGE_SIZE}
          sort={null}
          onSortChange={() => {}}
          onPageChange={setPage}
          loading={q.isLoading}
          getRowId={(r) => String(r.id)}
          empty={status ? 'No message with this status.' : 'Nothing has been sent yet. Nonconformance reports e-mailed to suppliers appear here.'}
        />
      )}
    </div>
  );
}

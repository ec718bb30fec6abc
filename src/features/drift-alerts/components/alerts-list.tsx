import { useState, type ReactNode } from 'react';
import type { AlertStatus, DriftAlertRow } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { EmptyState, Loading } from '../../../components/ui/page.tsx';
import { ALERTS_PAGE_SIZE, useAlerts } from '../api/get-alerts.ts';
import { AlertCard } from './alert-card.tsx';

/** Drift and mixed-stock alerts, newest first, filtered by status on the server. */
export function AlertsList({ canAct, supplierId, actions }: { canAct: boolean; supplierId?: number; actions?: (a: DriftAlertRow) => ReactNode }) {
  const [status, setStatus] = useState<AlertStatus | ''>('open');
  const [page, setPage] = useState(1);
  const q = useAlerts({ page, status: status || undefined, supplierId });
  const pages = Math.max(1, Math.ceil((q.data?.total ?? 0) / ALERTS_PAGE_SIZE));
  return (
    <div className="flex flex-col gap-3">
      <label className="flex w-48 flex-col gap-1 text-sm font-semibold text-ink-soft">
        Alerts
        <select
          value={status}
          onChange={(e) => {
            setStatus(e.target.value as AlertStatus | '');
            setPage(1);
          }}
          className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
        >
          <option value="open">Open</option>
          <option value="acknowledged">Acknowledged</option>
          <option value="">All</option>
        </select>
      </label>
      {q.isLoading ? (
        <Loading label="Checking disposed lots and loading alerts…" />
      ) : q.isError ? (
        <Notice tone="fail" title="The alerts could not be loaded">{(q.error as Error).message}</Notice>
      ) : q.data!.items.length === 0 ? (
        <EmptyState title={status === 'open' ? 'No open alerts' : 'No alerts'}>Every disposed lot is compared with its supplier’s accepted history; alerts appear here.</EmptyState>
      ) : (
        <>
          {q.data!.items.map((a) => (
            <AlertCard key={a.id} alert={a} canAct={canAct} actions={actions?.(a)} />
          ))}
          <div className="flex items-center justify-end gap-2 text-xs text-ink-soft">
            <Button variant="quiet" disabled={page <= 1} onClick={() => setPage(page - 1)}>
              ‹ Newer
            </Button>
            <span className="num">
              Page {page} of {pages}
            </span>
            <Button variant="quiet" disabled={page >= pages} onClick={() => setPage(page + 1)}>
              Older ›
            </Button>
          </div>
        </>
      )}
    </div>
  );
}

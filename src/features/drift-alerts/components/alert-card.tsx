import { useState, type ReactNode } from 'react';
import type { DriftAlertRow } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useAcknowledgeAlert } from '../api/acknowledge-alert.ts';

const CHECK_LABEL = { ks: 'Distribution differs', median: 'Median shifted', bimodal: 'Two groups', outside: 'Outside gain group' } as const;

function Figures({ f }: { f: DriftAlertRow['figures'] }) {
  const rows: [string, string][] = [
    ['Readings (lot / history)', `${f.n} / ${f.historyN}${f.historyLots ? ` from ${f.historyLots} lot${f.historyLots === 1 ? '' : 's'}` : ''}`],
    ['KS D, p', f.ks ? `${f.ks.d.toFixed(3)}, ${f.ks.pValue < 0.0001 ? '< 0.0001' : f.ks.pValue.toFixed(4)}` : '—'],
    ['Median (lot / history)', `${f.median.lot.toFixed(1)} / ${f.median.history?.toFixed(1) ?? '—'}`],
    ['Median shift', f.median.shiftPct !== null ? `${f.median.shiftPct > 0 ? '+' : ''}${f.median.shiftPct.toFixed(1)} %${f.median.shiftIqr !== null ? ` (${f.median.shiftIqr.toFixed(2)} IQR)` : ''}` : '—'],
    ['Bimodality b', f.bimodality ? `${f.bimodality.b.toFixed(3)} (threshold 0.556)` : '—'],
    ['Outside gain group', `${(f.outside.share * 100).toFixed(1)} % (${f.outside.count})`],
  ];
  return (
    <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-xs sm:grid-cols-3">
      {rows.map(([k, v]) => (
        <div key={k}>
          <dt className="font-semibold uppercase tracking-wide text-ink-faint">{k}</dt>
          <dd className="num text-sm text-ink">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

/** One drift alert: what stood out, in figures and words, the checks to consider, and the acknowledgement. */
export function AlertCard({ alert, canAct, actions }: { alert: DriftAlertRow; canAct: boolean; actions?: ReactNode }) {
  const [acking, setAcking] = useState(false);
  const [note, setNote] = useState('');
  const ack = useAcknowledgeAlert();
  const err = ack.error instanceof ApiError ? ack.error : null;
  return (
    <article className="rounded-lg border border-rule bg-panel p-4" aria-labelledby={`alert-${alert.id}`} data-testid="drift-alert">
      <header className="flex flex-wrap items-start justify-between gap-2">
        <div>
          <h3 id={`alert-${alert.id}`} className="font-bold text-ink">
            Lot {alert.lot.code} · {alert.partType.partNumber} · {alert.supplier.name}
          </h3>
          <p className="text-xs text-ink-soft">
            Raised {new Date(alert.raisedAt).toLocaleString()} · lot {alert.lot.status} · date code {alert.lot.dateCode ?? 'not stated'}
          </p>
        </div>
        <div className="flex flex-wrap gap-1">
          {alert.status === 'open' ? <StatusTag tone="hold">Open</StatusTag> : <StatusTag tone="pass">Acknowledged</StatusTag>}
          {alert.flags.map((f) => (
            <StatusTag key={f.check} tone="neutral">
              {CHECK_LABEL[f.check]}
            </StatusTag>
          ))}
        </div>
      </header>
      <div className="mt-3">
        <Figures f={alert.figures} />
      </div>
      <p className="mt-3 text-sm text-ink">{alert.explanation}</p>
      {alert.suggestedChecks.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer font-semibold text-ink-soft">Inspections to consider (SAE AS6081, IDEA-STD-1010)</summary>
          <ul className="ml-5 mt-1 list-disc text-ink-soft">
            {alert.suggestedChecks.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </details>
      )}
      {alert.acknowledged && (
        <p className="mt-2 text-sm text-ink-soft">
          ✓ Acknowledged by {alert.acknowledged.by} on {new Date(alert.acknowledged.at).toLocaleString()}: “{alert.acknowledged.note}”
        </p>
      )}
      {alert.ncrs.length > 0 && <p className="mt-1 text-sm text-ink-soft">NCR: {alert.ncrs.map((n) => `${n.code} (${n.status})`).join(', ')}</p>}
      {canAct && (
        <div className="mt-3 flex flex-wrap items-start gap-2">
          {actions}
          {alert.status === 'open' && !acking && (
            <Button onClick={() => setAcking(true)} aria-label={`Acknowledge the alert on lot ${alert.lot.code}`}>
              Acknowledge…
            </Button>
          )}
        </div>
      )}
      {acking && alert.status === 'open' && (
        <form
          className="mt-3 flex flex-col gap-2"
          aria-label={`Acknowledge the alert on lot ${alert.lot.code}`}
          onSubmit={(e) => {
            e.preventDefault();
            ack.mutate({ id: alert.id, note }, { onSuccess: () => setAcking(false) });
          }}
        >
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
            Note (what was checked, what follows)
            <textarea
              value={note}
              onChange={(e) => setNote(e.target.value)}
              rows={3}
              autoFocus
              aria-invalid={Boolean(err?.fieldError('note'))}
              className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink aria-[invalid=true]:border-fail"
            />
          </label>
          {err?.fieldError('note') && (
            <p className="text-xs font-semibold text-fail" role="alert">
              ✕ {err.fieldError('note')}
            </p>
          )}
          {ack.isError && !err?.fieldError('note') && <Notice tone="fail">{(ack.error as Error).message}</Notice>}
          <div className="flex gap-2">
            <Button type="submit" variant="primary" busy={ack.isPending}>
              Acknowledge
            </Button>
            <Button type="button" onClick={() => setAcking(false)}>
              Cancel
            </Button>
          </div>
        </form>
      )}
    </article>
  );
}

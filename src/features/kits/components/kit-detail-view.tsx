import { useEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { KIT_OPEN_STATUSES, type KitDetail } from '../../../../shared/api/pairing.ts';
import { nextToPull, pullProgress } from '../../../../shared/domain/kitting/index.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { ScrollBox } from '../../../components/ui/scroll-box.tsx';
import { useCancelKit } from '../api/cancel-kit.ts';
import { kitLabelUrl, kitPickListUrl } from '../api/get-kit.ts';
import { fixed, formatDateTime, formatTime, modeText, setsText } from './format.ts';
import { SetsTable } from './kit-plan-view.tsx';
import { KitStatusTag } from './kit-status-tag.tsx';
import { MismatchFootnote } from './mismatch-meaning.tsx';
import { PullScanField } from './pull-scan-field.tsx';

function ProgressBar({ pulled, total }: { pulled: number; total: number }) {
  const pct = total ? Math.round((pulled / total) * 100) : 0;
  return (
    <div className="flex items-center gap-3">
      <div className="h-3 w-56 overflow-hidden rounded-full border border-rule bg-paper" role="progressbar" aria-valuemin={0} aria-valuemax={total} aria-valuenow={pulled} aria-label="Parts pulled">
        <div className="h-full bg-pass" style={{ width: `${pct}%` }} />
      </div>
      <span className="num text-lg font-bold text-ink" data-testid="pull-progress">
        {pulled} of {total} pulled
      </span>
    </div>
  );
}

/**
 * One kit: status and pull progress, the scan field for pulling, the pick list in storage order
 * (the next part marked), the sets with what their mismatch means, and the lots the parts came
 * from. Cancelling asks first and says what happens to pulled parts.
 */
export function KitDetailView({ kit, canEdit, lotHref }: { kit: KitDetail; canEdit: boolean; lotHref: ((lotId: number) => string) | null }) {
  const [confirm, setConfirm] = useState(false);
  const cancel = useCancelKit();
  const open = KIT_OPEN_STATUSES.includes(kit.status);
  const progress = pullProgress(kit.pickList);
  const next = open ? nextToPull(kit.pickList) : null;
  const esd = kit.partTypes.map((p) => p.esdHbmClass).filter(Boolean);
  // The last pull removes the scan field that had the focus: the focus moves to the news that the
  // kit is complete (its next step, the kit label, is the next Tab), not to the page.
  const completeRef = useRef<HTMLDivElement>(null);
  const wasOpen = useRef(open);
  useEffect(() => {
    if (wasOpen.current && kit.status === 'pulled') completeRef.current?.focus();
    wasOpen.current = open;
  }, [open, kit.status]);

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-center gap-x-6 gap-y-2">
        <KitStatusTag status={kit.status} />
        <ProgressBar pulled={progress.pulled} total={progress.total} />
        <span className="text-sm text-ink-soft">
          {setsText(kit.sets.length, kit.setSize)}, {modeText(kit.mode)} · hFE within {fixed(kit.hfeTolerancePct, 1)} %, Vbe within {fixed(kit.vbeToleranceMv, 2)} mV
        </span>
        {kit.reservedUntil && <span className="text-sm text-ink-soft">Reserved until {formatDateTime(kit.reservedUntil)}</span>}
        <span className="ml-auto flex flex-wrap gap-2">
          <a className="rounded-md border border-rule bg-panel px-3 py-1.5 text-sm font-semibold text-ink hover:bg-paper" href={kitPickListUrl(kit.id)} target="_blank" rel="noreferrer">
            Print pick list
          </a>
          {kit.pickList.length > 0 && (
            <a className="rounded-md border border-rule bg-panel px-3 py-1.5 text-sm font-semibold text-ink hover:bg-paper" href={kitLabelUrl(kit.id)} target="_blank" rel="noreferrer">
              Print kit label
            </a>
          )}
          {canEdit && open && (
            <Button variant="danger" onClick={() => setConfirm(true)}>
              Cancel kit…
            </Button>
          )}
        </span>
      </div>

      {kit.status === 'pulled' && (
        <div ref={completeRef} tabIndex={-1} className="rounded-md" data-testid="kit-complete">
          <Notice tone="pass" title="Kit complete">
            Every part is pulled{kit.completedAt ? ` (${formatDateTime(kit.completedAt)})` : ''}. Put the kit label on the bag:{' '}
            <a className="font-semibold text-ink underline" href={kitLabelUrl(kit.id)} target="_blank" rel="noreferrer">
              Print the kit label
            </a>
          </Notice>
        </div>
      )}
      {kit.status === 'expired' && (
        <Notice tone="hold" title="Reservation expired">
          The reservation ran out{kit.expiredAt ? ` at ${formatDateTime(kit.expiredAt)}` : ''}; {kit.released} part{kit.released === 1 ? '' : 's'} went back to stock. Plan a new kit.
        </Notice>
      )}
      {kit.status === 'cancelled' && (
        <Notice tone="info" title="Kit cancelled">
          Cancelled{kit.cancelledByName ? ` by ${kit.cancelledByName}` : ''}{kit.cancelledAt ? ` on ${formatDateTime(kit.cancelledAt)}` : ''}; {kit.released} part{kit.released === 1 ? '' : 's'} went back to
          stock. {kit.pickList.length ? `${kit.pickList.length} part${kit.pickList.length === 1 ? '' : 's'} pulled before stay recorded with this kit.` : ''}
        </Notice>
      )}
      {cancel.isError && (
        <Notice tone="fail" title="Not cancelled">
          {(cancel.error as Error).message}
        </Notice>
      )}

      {canEdit && open && (
        <Panel title="Pull by scanning">
          <PullScanField kit={kit} />
          {next && (
            <p className="mt-2 text-sm text-ink-soft" data-testid="next-pick">
              Next: <span className="font-semibold text-ink">{next.location}</span> · <span className="whitespace-nowrap font-mono">{next.containerCode}</span> position <span className="font-semibold text-ink">{next.position}</span>
            </p>
          )}
        </Panel>
      )}

      <section aria-labelledby="pick-heading" className="flex flex-col gap-2">
        <h2 id="pick-heading" className="text-base font-bold text-ink">
          Pick list, in storage order
        </h2>
        {kit.pickList.length === 0 ? (
          <p className="text-sm text-ink-soft">This kit holds no parts.</p>
        ) : (
          <ScrollBox label="Pick list" className="rounded-lg border border-rule bg-panel">
            {/* At least 52rem wide: on a phone the list scrolls sideways instead of breaking codes over lines. */}
            <table className="w-full min-w-[52rem] border-collapse text-sm">
              <caption className="sr-only">Pick list</caption>
              <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
                <tr>
                  {['#', 'Location', 'Container', 'Position', 'Set', 'Part', 'Lot · supplier lot', 'hFE', 'Vbe mV', 'Pulled'].map((h) => (
                    <th key={h} scope="col" className={`px-3 py-2 ${['hFE', 'Vbe mV', 'Position', 'Set', '#'].includes(h) ? 'text-right' : ''}`}>
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {kit.pickList.map((p, i) => {
                  const isNext = next !== null && p.containerCode === next.containerCode && p.position === next.position;
                  return (
                    <tr key={`${p.containerCode}/${p.position}/${p.measurementId}`} className={`border-t border-rule/70 ${isNext ? 'bg-copper-light/60' : p.pulledAt ? 'text-ink-soft' : ''}`} aria-current={isNext ? 'step' : undefined}>
                      <td className="num px-3 py-1.5 text-right">{i + 1}</td>
                      <td className="min-w-[10rem] px-3 py-1.5 font-semibold">{p.location}</td>
                      <td className="whitespace-nowrap px-3 py-1.5 font-mono">{p.containerCode}</td>
                      <td className="num px-3 py-1.5 text-right text-base font-bold">{p.position}</td>
                      <td className="num px-3 py-1.5 text-right">{p.setIndex}</td>
                      <td className="px-3 py-1.5">
                        {p.partNumber} <span className="text-xs text-ink-faint">{p.polarity}</span>
                      </td>
                      <td className="whitespace-nowrap px-3 py-1.5">
                        {lotHref ? (
                          <Link to={lotHref(p.lotId)} className="font-mono underline-offset-2 hover:underline">
                            {p.lotCode}
                          </Link>
                        ) : (
                          <span className="font-mono">{p.lotCode}</span>
                        )}{' '}
                        <span className="text-ink-soft">· {p.supplierLot ?? '—'}</span>
                      </td>
                      <td className="num px-3 py-1.5 text-right">{fixed(p.hfe25, 1)}</td>
                      <td className="num px-3 py-1.5 text-right">{fixed(p.vbeMv25, 1)}</td>
                      <td className="px-3 py-1.5">
                        {p.pulledAt ? (
                          <span className="text-pass">
                            ✓ {formatTime(p.pulledAt)} <span className="text-ink-soft">{p.pulledByName}</span>
                          </span>
                        ) : isNext ? (
                          <span className="font-semibold text-copper-dark">▶ next</span>
                        ) : (
                          <span className="text-ink-faint">waiting</span>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </ScrollBox>
        )}
      </section>

      <section aria-labelledby="sets-heading" className="flex flex-col gap-2">
        <h2 id="sets-heading" className="text-base font-bold text-ink">
          Sets and what their mismatch means
        </h2>
        <SetsTable sets={kit.sets} caption="Sets of the kit" />
        {kit.sets[0] && <MismatchFootnote vtMv={kit.sets[0].meaning.vtMv} />}
      </section>

      <Panel title="Where the parts came from">
        <ul className="flex flex-col gap-1 text-sm" aria-label="Source lots">
          {kit.sourceLots.map((l) => (
            <li key={l.lotId}>
              {lotHref ? (
                <Link to={lotHref(l.lotId)} className="font-mono font-semibold underline underline-offset-2">
                  {l.lotCode}
                </Link>
              ) : (
                <span className="font-mono font-semibold">{l.lotCode}</span>
              )}{' '}
              · supplier lot <span className="font-mono">{l.supplierLot ?? '—'}</span> · {l.supplierName} · {l.partNumber} ·{' '}
              {l.parts} part{l.parts === 1 ? '' : 's'}
            </li>
          ))}
        </ul>
        {kit.note && <p className="mt-2 text-sm text-ink-soft">Note: {kit.note}</p>}
        <p className="mt-2 text-xs text-ink-faint">
          Requested {formatDateTime(kit.createdAt)} by {kit.createdByName}.
        </p>
      </Panel>

      <p className="text-xs text-ink-faint">
        ESD-sensitive parts{esd.length ? ` (HBM class ${esd.join(', ')})` : ''}: pull them at an ESD-protected workstation with a grounded wrist strap (ANSI/ESD S20.20), following your site's procedures.
      </p>

      <ConfirmDialog
        open={confirm}
        title={`Cancel kit ${kit.code}?`}
        confirmLabel="Cancel the kit"
        busy={cancel.isPending}
        onCancel={() => setConfirm(false)}
        onConfirm={() => cancel.mutate({ id: kit.id, body: { reason: 'Cancelled at the pick list' } }, { onSettled: () => setConfirm(false) })}
      >
        The {progress.total - progress.pulled} part{progress.total - progress.pulled === 1 ? '' : 's'} not yet pulled go back to stock and can be planned again.
        {progress.pulled > 0 && ` The ${progress.pulled} part${progress.pulled === 1 ? '' : 's'} already pulled stay recorded with this kit; return them through Bins if they go back.`}
      </ConfirmDialog>
    </div>
  );
}

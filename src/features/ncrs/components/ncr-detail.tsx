import { useState } from 'react';
import type { NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { useCloseNcr } from '../api/close-ncr.ts';
import { useSendNcr } from '../api/send-ncr.ts';
import { AnswerForm } from './answer-form.tsx';
import { NcrStatusTag } from './ncr-status-tag.tsx';

const MAIL_TAG = {
  sent: <StatusTag tone="pass">E-mail delivered to the mail server</StatusTag>,
  queued: <StatusTag tone="info">E-mail waiting to go out</StatusTag>,
  failed: <StatusTag tone="fail">E-mail failed — kept and retried</StatusTag>,
};

function Text({ title, children }: { title: string; children: string }) {
  return (
    <div>
      <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-faint">{title}</h3>
      <p className="whitespace-pre-line text-sm text-ink">{children}</p>
    </div>
  );
}

/** An NCR with its PDF, sending, the supplier's answer and closing. */
export function NcrDetailView({ ncr, canAct }: { ncr: NcrDetail; canAct: boolean }) {
  const [confirmSend, setConfirmSend] = useState(false);
  const [confirmClose, setConfirmClose] = useState(false);
  const [closeNote, setCloseNote] = useState('');
  const send = useSendNcr();
  const close = useCloseNcr();
  const canSend = canAct && (ncr.status === 'open' || ncr.status === 'sent');
  return (
    <div className="grid gap-5 lg:grid-cols-[1fr_24rem]">
      <div className="flex flex-col gap-5">
        <Panel title="Report">
          <div className="flex flex-col gap-3">
            <div className="flex flex-wrap items-center gap-2 text-sm">
              <NcrStatusTag status={ncr.status} />
              {ncr.overdue && <StatusTag tone="fail">Answer overdue</StatusTag>}
              <span className="text-ink-soft">
                Raised {new Date(ncr.createdAt).toLocaleDateString()} by {ncr.createdBy} · answer due <span className="num">{ncr.dueDate}</span>
              </span>
            </div>
            <p className="text-sm text-ink-soft">
              {ncr.supplier.name} · lot <span className="num">{ncr.lot.code}</span> ({ncr.lot.status}) · {ncr.partType.partNumber}
              {ncr.alertId !== null && ' · raised from a drift alert'}
            </p>
            <Text title="Findings">{ncr.findings}</Text>
            <Text title="Disposition">{ncr.disposition}</Text>
            <Text title="Corrective action requested">{ncr.correctiveAction}</Text>
          </div>
        </Panel>
        <Panel title="Supplier's answer">
          {ncr.answer ? (
            <div className="flex flex-col gap-2 text-sm" data-testid="ncr-answer">
              <p className="whitespace-pre-line text-ink">{ncr.answer.text}</p>
              <p className="text-ink-soft">
                Document:{' '}
                <a href={ncr.answer.document.url} className="font-semibold text-copper-dark underline" download>
                  {ncr.answer.document.name}
                </a>{' '}
                · recorded by {ncr.answer.by} on {new Date(ncr.answer.at).toLocaleString()}
              </p>
            </div>
          ) : canAct && ncr.status !== 'closed' ? (
            <AnswerForm ncr={ncr} />
          ) : (
            <p className="text-sm text-ink-soft">No answer recorded yet.</p>
          )}
        </Panel>
      </div>
      <div className="flex flex-col gap-5">
        <Panel title="PDF and e-mail">
          <div className="flex flex-col gap-3 text-sm">
            <a href={ncr.pdfUrl} target="_blank" rel="noreferrer" className="font-semibold text-copper-dark underline">
              Open the report (PDF)
            </a>
            {ncr.recipient ? (
              <p className="text-ink-soft">
                Goes to {ncr.recipient.name} &lt;{ncr.recipient.email}&gt;{ncr.recipient.duty ? ` (${ncr.recipient.duty})` : ''}.
              </p>
            ) : (
              <Notice tone="hold" title="No supplier contact">Add a contact with the duty “quality” under Catalog → Suppliers before sending.</Notice>
            )}
            {ncr.sentAt && (
              <div className="flex flex-col gap-1" data-testid="ncr-mail">
                <p className="text-ink-soft">
                  Sent to {ncr.sentTo} on {new Date(ncr.sentAt).toLocaleString()}.
                </p>
                {ncr.mail && MAIL_TAG[ncr.mail.status]}
                {ncr.mail?.status === 'failed' && <p className="text-xs text-ink-soft">{ncr.mail.lastError} — the outbox keeps the message and tries again.</p>}
              </div>
            )}
            {canSend && (
              <div>
                <Button variant="primary" onClick={() => setConfirmSend(true)} disabled={!ncr.recipient}>
                  {ncr.status === 'sent' ? 'Send again…' : 'Send to supplier…'}
                </Button>
              </div>
            )}
            {send.isError && <Notice tone="fail" title="Not sent">{(send.error as Error).message}</Notice>}
          </div>
        </Panel>
        <Panel title="Close">
          {ncr.closed ? (
            <p className="text-sm text-ink-soft" data-testid="ncr-closed">
              ✓ Closed by {ncr.closed.by} on {new Date(ncr.closed.at).toLocaleString()}
              {ncr.closed.note ? `: ${ncr.closed.note}` : '.'}
            </p>
          ) : ncr.status !== 'answered' ? (
            <p className="text-sm text-ink-soft">Closing needs the supplier's answer recorded first (text and document).</p>
          ) : canAct ? (
            <div className="flex flex-col gap-2">
              <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
                Closing note (optional)
                <textarea rows={2} value={closeNote} onChange={(e) => setCloseNote(e.target.value)} className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink" />
              </label>
              <div>
                <Button variant="primary" onClick={() => setConfirmClose(true)}>
                  Close NCR…
                </Button>
              </div>
              {close.isError && <Notice tone="fail">{(close.error as Error).message}</Notice>}
            </div>
          ) : null}
        </Panel>
      </div>
      <ConfirmDialog
        open={confirmSend}
        title={`Send ${ncr.code} to the supplier?`}
        confirmLabel="Send e-mail"
        tone="primary"
        busy={send.isPending}
        onCancel={() => setConfirmSend(false)}
        onConfirm={() => send.mutate(ncr.id, { onSettled: () => setConfirmSend(false) })}
      >
        The report goes as a PDF attachment to {ncr.recipient?.name} &lt;{ncr.recipient?.email}&gt;. After sending, the NCR can no longer be edited.
      </ConfirmDialog>
      <ConfirmDialog
        open={confirmClose}
        title={`Close ${ncr.code}?`}
        confirmLabel="Close NCR"
        tone="primary"
        busy={close.isPending}
        onCancel={() => setConfirmClose(false)}
        onConfirm={() => close.mutate({ id: ncr.id, note: closeNote.trim() || null }, { onSettled: () => setConfirmClose(false) })}
      >
        The supplier's answer is accepted and the NCR is closed. This is recorded in the audit trail.
      </ConfirmDialog>
    </div>
  );
}

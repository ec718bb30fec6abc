import { useState, type FormEvent } from 'react';
import { MRB_ACTIONS, MRB_ACTION_LABELS, type DispositionDecision, type DispositionView, type MrbAction, type Recommendation } from '../../../../shared/api/disposition.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { FieldShell, SelectField } from '../../../components/ui/field.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { Loading, Panel } from '../../../components/ui/page.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useDisposition } from '../api/get-disposition.ts';
import { useProposeDisposition } from '../api/propose-disposition.ts';
import { useSignDisposition } from '../api/sign-disposition.ts';

const DECISION_LABEL: Record<DispositionDecision, string> = { accept: 'Accept', reject: 'Reject', mrb: 'MRB' };
const REC_TONE: Record<Recommendation['decision'], 'pass' | 'fail' | 'hold' | 'neutral'> = { accept: 'pass', reject: 'fail', blocked: 'hold', incomplete: 'neutral' };
const when = (iso: string) => new Date(iso).toLocaleString();

function DecisionText({ decision, mrbAction }: { decision: DispositionDecision; mrbAction: MrbAction | null }) {
  return (
    <>
      {DECISION_LABEL[decision]}
      {mrbAction ? ` — ${MRB_ACTION_LABELS[mrbAction]}` : ''}
    </>
  );
}

/** Form shared by propose and sign: decision, MRB action when MRB, reason. Keeps what was typed on error. */
function DecisionForm({
  label,
  initial,
  submitLabel,
  busy,
  error,
  onSubmit,
}: {
  label: string;
  initial: DispositionDecision;
  submitLabel: string;
  busy: boolean;
  error: ApiError | null;
  onSubmit: (v: { decision: DispositionDecision; mrbAction: MrbAction | null; reason: string }) => void;
}) {
  const [decision, setDecision] = useState<DispositionDecision>(initial);
  const [mrbAction, setMrbAction] = useState<MrbAction | ''>('');
  const [reason, setReason] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    onSubmit({ decision, mrbAction: decision === 'mrb' ? (mrbAction || null) : null, reason });
  };
  return (
    <form onSubmit={submit} noValidate aria-label={label} className="grid gap-3">
      {error && !error.problem.errors?.length && <Notice tone="fail">{error.problem.detail}</Notice>}
      <SelectField
        label="Decision"
        value={decision}
        onChange={(e) => setDecision(e.target.value as DispositionDecision)}
        error={error?.fieldError('decision')}
        options={[
          { value: 'accept', label: 'Accept' },
          { value: 'reject', label: 'Reject' },
          { value: 'mrb', label: 'MRB (material review)' },
        ]}
      />
      {decision === 'mrb' && (
        <SelectField
          label="MRB action"
          value={mrbAction}
          onChange={(e) => setMrbAction(e.target.value as MrbAction | '')}
          error={error?.fieldError('mrbAction')}
          options={[{ value: '', label: '— choose —' }, ...MRB_ACTIONS.map((a) => ({ value: a, label: MRB_ACTION_LABELS[a] }))]}
        />
      )}
      <FieldShell label="Reason" error={error?.fieldError('reason')} hint="Say what the decision rests on; it goes into the report and the audit trail.">
        {({ id, describedBy, invalid }) => (
          <textarea
            id={id}
            aria-describedby={describedBy}
            aria-invalid={invalid}
            rows={3}
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            className="w-full rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base text-ink focus:border-copper focus:outline-none aria-[invalid=true]:border-fail"
          />
        )}
      </FieldShell>
      <Button type="submit" variant="primary" busy={busy}>
        {submitLabel}
      </Button>
    </form>
  );
}

/**
 * The disposition: what the product recommends, the inspector's proposal, the quality engineer's
 * signature. Signing locks the lot's disposition.
 */
export function DispositionPanel({ lotId, role, onChanged }: { lotId: number; role: string; onChanged: () => void }) {
  const q = useDisposition(lotId);
  const propose = useProposeDisposition(lotId);
  const sign = useSignDisposition(lotId);
  const [pendingSign, setPendingSign] = useState<{ decision: DispositionDecision; mrbAction: MrbAction | null; reason: string } | null>(null);
  const canPropose = role === 'inspector' || role === 'quality';
  const canSign = role === 'quality';

  if (q.isLoading) return <Panel title="Disposition"><Loading /></Panel>;
  if (q.isError || !q.data) return <Panel title="Disposition"><Notice tone="fail" title="The disposition could not be loaded">{(q.error as Error | null)?.message}</Notice></Panel>;
  const d: DispositionView = q.data;
  const rec = d.recommendation;
  const initial: DispositionDecision = rec.decision === 'reject' ? 'reject' : rec.decision === 'blocked' ? 'reject' : 'accept';

  return (
    <Panel title="Disposition">
      <div className="flex flex-col gap-4">
        <div data-testid="recommendation">
          <p className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-faint">Binwright recommends</p>
          <div className="flex flex-wrap items-center gap-2">
            <StatusTag tone={REC_TONE[rec.decision]}>{rec.decision}</StatusTag>
            <span className="text-sm text-ink">{rec.reason}</span>
          </div>
        </div>

        {d.proposal && (
          <div className="rounded-md border border-rule bg-paper px-3 py-2 text-sm" data-testid="proposal">
            <p className="font-semibold text-ink">
              Proposed: <DecisionText decision={d.proposal.decision} mrbAction={d.proposal.mrbAction} />
            </p>
            <p className="text-ink-soft">
              by {d.proposal.by.name}, {when(d.proposal.by.at)} — “{d.proposal.reason}”
            </p>
          </div>
        )}

        {d.signature ? (
          <div className={`rounded-md border-l-4 px-3 py-2 ${d.signature.decision === 'accept' ? 'border-pass bg-pass-light' : d.signature.decision === 'reject' ? 'border-fail bg-fail-light' : 'border-info bg-info-light'}`} data-testid="signature">
            <p className="text-lg font-bold text-ink">
              Signed: <DecisionText decision={d.signature.decision} mrbAction={d.signature.mrbAction} />
            </p>
            <p className="text-sm text-ink-soft">
              Signed by {d.signature.by.name}, {when(d.signature.by.at)} — “{d.signature.reason}”. The disposition is locked.
            </p>
          </div>
        ) : (
          <>
            {canSign && d.proposal && (
              <div className="border-t border-rule pt-3">
                <h3 className="mb-2 text-sm font-bold text-ink">Sign as quality engineer</h3>
                <DecisionForm
                  key={`sign-${d.proposal.by.at}`}
                  label="Sign the disposition"
                  initial={d.proposal.decision}
                  submitLabel="Sign…"
                  busy={sign.isPending}
                  error={sign.error instanceof ApiError ? sign.error : null}
                  onSubmit={setPendingSign}
                />
              </div>
            )}
            {canPropose && (
              <div className="border-t border-rule pt-3">
                <h3 className="mb-2 text-sm font-bold text-ink">{d.proposal ? 'Change the proposal' : 'Propose a disposition'}</h3>
                <DecisionForm
                  label="Propose a disposition"
                  initial={initial}
                  submitLabel={d.proposal ? 'Update proposal' : 'Propose'}
                  busy={propose.isPending}
                  error={propose.error instanceof ApiError ? propose.error : null}
                  onSubmit={(v) => propose.mutate(v, { onSuccess: onChanged })}
                />
              </div>
            )}
            {!canPropose && !d.proposal && <p className="text-sm text-ink-soft">An inspector proposes the disposition; a quality engineer signs it.</p>}
          </>
        )}
        <ConfirmDialog
          open={pendingSign !== null}
          title="Sign and lock this disposition?"
          confirmLabel="Sign"
          tone="primary"
          busy={sign.isPending}
          onCancel={() => setPendingSign(null)}
          onConfirm={() => {
            if (!pendingSign) return;
            sign.mutate(pendingSign, {
              onSuccess: onChanged,
              onSettled: () => setPendingSign(null),
            });
          }}
        >
          {pendingSign && (
            <>
              You sign: <strong><DecisionText decision={pendingSign.decision} mrbAction={pendingSign.mrbAction} /></strong>. The lot takes its final status, the
              supplier's switching state advances, and the decision cannot be changed afterwards.
            </>
          )}
        </ConfirmDialog>
      </div>
    </Panel>
  );
}

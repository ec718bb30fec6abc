import { useState, type FormEvent } from 'react';
import type { LotPlanResponse, SwitchingSeverityName } from '../../../../shared/api/sampling.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { Notice, StatusTag } from '../../../components/ui/notice.tsx';
import { Panel } from '../../../components/ui/page.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useRecordCorrectiveAction } from '../api/record-corrective-action.ts';

const METHOD_LABEL = { attribute: 'Attribute, single sampling', 'zero-acceptance': 'Zero acceptance (c = 0)', variables: 'Variables, s-method on hFE' } as const;
const SEVERITY_TONE: Record<SwitchingSeverityName, 'pass' | 'hold' | 'fail' | 'info'> = { normal: 'info', reduced: 'pass', tightened: 'hold', discontinued: 'fail' };

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs font-semibold uppercase tracking-wide text-ink-faint">{label}</dt>
      <dd className="num text-base text-ink">{children}</dd>
    </div>
  );
}

/** The plan that applies to the lot, the severity from the switching state and why, and what is left to measure. */
export function LotPlanPanel({ data, canRecordCorrectiveAction }: { data: LotPlanResponse; canRecordCorrectiveAction: boolean }) {
  const { plan, switching, partType } = data;
  const done = plan ? Math.min(data.measured, plan.sampleSize) : 0;
  return (
    <Panel title="Sampling plan">
      {data.planAsSigned ? (
        <div className="mb-3 flex flex-wrap items-center gap-2" data-testid="severity">
          <StatusTag tone={SEVERITY_TONE[data.planSeverity]}>{`${data.planSeverity} inspection`}</StatusTag>
          <span className="text-sm text-ink-soft">
            The plan this lot was judged by, as stored with the signature. The supplier now stands on {switching.severity}: {switching.reason}
          </span>
        </div>
      ) : (
        <div className="mb-3 flex flex-wrap items-center gap-2" data-testid="severity">
          <StatusTag tone={SEVERITY_TONE[switching.severity]}>{switching.severity === 'discontinued' ? 'acceptance discontinued' : `${switching.severity} inspection`}</StatusTag>
          <span className="text-sm text-ink-soft">{switching.reason}</span>
        </div>
      )}
      {plan ? (
        <>
          <dl className="grid grid-cols-2 gap-x-4 gap-y-2 sm:grid-cols-4">
            <Fact label="Method">{METHOD_LABEL[plan.method]}</Fact>
            <Fact label="Level · AQL">
              {partType.inspectionLevel} · {partType.aql} %
            </Fact>
            <Fact label="Code letter">
              {plan.codeLetter}
              {plan.planLetter && plan.planLetter !== plan.codeLetter ? ` → ${plan.planLetter}` : ''}
            </Fact>
            {plan.method === 'variables' ? (
              <Fact label="n · k">
                {plan.sampleSize} · k {plan.k}
              </Fact>
            ) : (
              <Fact label="n · Ac / Re">
                {plan.sampleSize}
                {plan.hundredPercent ? ' (100 %)' : ''} · {plan.accept} / {plan.reject}
              </Fact>
            )}
          </dl>
          <div className="mt-3" aria-label="Sample progress">
            <div className="flex justify-between text-sm">
              <span className="font-semibold text-ink" data-testid="remaining">
                {data.remaining > 0 ? `${data.remaining} of ${plan.sampleSize} still to measure` : `Sample complete (${data.measured} measured)`}
              </span>
              <span className="num text-ink-soft">
                {done}/{plan.sampleSize}
              </span>
            </div>
            <div className="mt-1 h-2 overflow-hidden rounded bg-paper" role="progressbar" aria-label="Parts of the sample measured" aria-valuemin={0} aria-valuemax={plan.sampleSize} aria-valuenow={done}>
              <div className={`h-full ${data.remaining > 0 ? 'bg-copper' : 'bg-pass'}`} style={{ width: `${(100 * done) / plan.sampleSize}%` }} />
            </div>
          </div>
          <p className="mt-3 text-xs text-ink-faint">Source: {plan.source}</p>
          {plan.notes.length > 0 && (
            <ul className="mt-2 list-disc space-y-1 pl-5 text-xs text-ink-soft">
              {plan.notes.map((n) => (
                <li key={n}>{n}</li>
              ))}
            </ul>
          )}
        </>
      ) : (
        <Notice tone="fail" title="No sampling plan applies">
          {data.planError} Ask a quality engineer to check the part type's sampling settings in the Catalog.
        </Notice>
      )}
      {switching.acceptanceBlocked && canRecordCorrectiveAction && !data.planAsSigned && <CorrectiveActionForm supplierId={switching.supplierId} partTypeId={switching.partTypeId} />}
    </Panel>
  );
}

function CorrectiveActionForm({ supplierId, partTypeId }: { supplierId: number; partTypeId: number }) {
  const [note, setNote] = useState('');
  const m = useRecordCorrectiveAction();
  const err = m.error instanceof ApiError ? m.error : null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    m.mutate({ supplierId, partTypeId, note });
  };
  return (
    <form onSubmit={submit} className="mt-4 grid gap-2 border-t border-rule pt-3" aria-label="Supplier corrective action">
      <p className="text-sm text-ink-soft">Acceptance resumes on tightened inspection once the supplier's corrective action is recorded (ISO 2859-1 9.4).</p>
      {err && !err.problem.errors?.length && <Notice tone="fail">{err.problem.detail}</Notice>}
      <TextField label="Corrective action" value={note} onChange={(e) => setNote(e.target.value)} error={err?.fieldError('note')} hint="e.g. the supplier's 8D report number and what was verified" />
      <Button type="submit" variant="primary" busy={m.isPending}>
        Record corrective action
      </Button>
    </form>
  );
}

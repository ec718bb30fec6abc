import { useState } from 'react';
import type { NcrDetail, NcrDraft } from '../../../../shared/api/supplier-quality.ts';
import { Button } from '../../../components/ui/button.tsx';
import { FieldShell, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateNcr } from '../api/create-ncr.ts';

const area = 'w-full rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base text-ink focus:border-copper focus:outline-none aria-[invalid=true]:border-fail';

/** The NCR form, started from the lot's figures; what was typed stays after an error. */
export function NcrCreateForm({ draft, onCreated, onCancel }: { draft: NcrDraft; onCreated: (ncr: NcrDetail) => void; onCancel: () => void }) {
  const [findings, setFindings] = useState(draft.findings);
  const [disposition, setDisposition] = useState(draft.disposition);
  const [correctiveAction, setCorrectiveAction] = useState('');
  const [dueDate, setDueDate] = useState(draft.dueDate);
  const create = useCreateNcr();
  const err = create.error instanceof ApiError ? create.error : null;
  const fe = (f: string) => err?.fieldError(f);
  return (
    <form
      aria-label="Raise a nonconformance report"
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate({ lotId: draft.lotId, alertId: draft.alertId, findings, disposition, correctiveAction, dueDate }, { onSuccess: onCreated });
      }}
    >
      <p className="text-sm text-ink-soft">
        Lot <span className="num font-semibold">{draft.lotCode}</span> · {draft.partNumber} · {draft.supplierName}
        {draft.alertId !== null && ' · from a drift alert'}
      </p>
      {draft.existing && (
        <Notice tone="hold" title={`This lot already has ${draft.existing.code}`}>
          A second NCR is refused while the first is not closed.
        </Notice>
      )}
      <FieldShell label="Findings (filled from the lot's figures)" error={fe('findings')}>
        {({ id, describedBy, invalid }) => <textarea id={id} aria-describedby={describedBy} aria-invalid={invalid} rows={7} value={findings} onChange={(e) => setFindings(e.target.value)} className={area} />}
      </FieldShell>
      <FieldShell label="Disposition" error={fe('disposition')}>
        {({ id, describedBy, invalid }) => <textarea id={id} aria-describedby={describedBy} aria-invalid={invalid} rows={2} value={disposition} onChange={(e) => setDisposition(e.target.value)} className={area} />}
      </FieldShell>
      <FieldShell label="Corrective action requested" hint="What the supplier must explain and do; at least 10 characters." error={fe('correctiveAction')}>
        {({ id, describedBy, invalid }) => (
          <textarea id={id} aria-describedby={describedBy} aria-invalid={invalid} rows={3} value={correctiveAction} onChange={(e) => setCorrectiveAction(e.target.value)} className={area} />
        )}
      </FieldShell>
      <div className="w-48">
        <TextField label="Answer due" type="date" value={dueDate} onChange={(e) => setDueDate(e.target.value)} error={fe('dueDate')} />
      </div>
      {create.isError && !err?.problem.errors?.some((x) => ['findings', 'disposition', 'correctiveAction', 'dueDate'].includes(x.field)) && (
        <Notice tone="fail" title="The NCR was not raised">{(create.error as Error).message}</Notice>
      )}
      <div className="flex gap-2">
        <Button type="submit" variant="primary" busy={create.isPending}>
          Raise NCR
        </Button>
        <Button type="button" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

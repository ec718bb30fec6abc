import { useState } from 'react';
import { APPROVAL_LABELS, APPROVAL_STATUSES, type ApprovalStatus, type SupplierDetail } from '../../../../shared/api/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useUpdateSupplier } from '../api/update-supplier.ts';
import { ApprovalTag } from './approval-tag.tsx';

const MEANING: Record<ApprovalStatus, string> = {
  approved: 'Lots are received as usual.',
  conditional: 'Lots are received; watch them closely until the open issue is closed.',
  'not-approved': "Receiving a lot needs a quality engineer's override, recorded in the audit trail.",
};

/** Shows the approval status; a quality engineer changes it with a reason, after a confirmation. */
export function SupplierApproval({ supplier, canEdit }: { supplier: SupplierDetail; canEdit: boolean }) {
  const [next, setNext] = useState<ApprovalStatus>(supplier.approval);
  const [reason, setReason] = useState('');
  const [confirming, setConfirming] = useState(false);
  const update = useUpdateSupplier();
  const err = update.error instanceof ApiError ? update.error : null;
  const changing = next !== supplier.approval;
  const toNotApproved = next === 'not-approved';

  return (
    <div className="flex flex-col gap-3">
      <div className="flex items-center gap-2">
        <ApprovalTag approval={supplier.approval} />
        <span className="text-sm text-ink-soft">{MEANING[supplier.approval]}</span>
      </div>
      {canEdit && (
        <form
          aria-label="Change approval"
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            if (changing) setConfirming(true);
          }}
        >
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
            New status
            <select
              value={next}
              onChange={(e) => setNext(e.target.value as ApprovalStatus)}
              className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink"
            >
              {APPROVAL_STATUSES.map((a) => (
                <option key={a} value={a}>
                  {APPROVAL_LABELS[a]}
                </option>
              ))}
            </select>
          </label>
          <label className="flex min-w-64 flex-1 flex-col gap-1 text-sm font-semibold text-ink-soft">
            Reason (kept in the audit trail)
            <input
              value={reason}
              maxLength={400}
              onChange={(e) => setReason(e.target.value)}
              aria-invalid={Boolean(err?.fieldError('approvalReason'))}
              placeholder="e.g. corrective action closed, NCR 2026-014"
              className="rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base font-normal text-ink aria-[invalid=true]:border-fail"
            />
          </label>
          <Button type="submit" variant={toNotApproved ? 'danger' : 'primary'} disabled={!changing}>
            Change approval…
          </Button>
        </form>
      )}
      {err && <Notice tone="fail">{err.fieldError('approvalReason') ?? err.problem.detail}</Notice>}
      <ConfirmDialog
        open={confirming}
        title={toNotApproved ? `Mark ${supplier.name} as not approved?` : `Change ${supplier.name} to ${APPROVAL_LABELS[next].toLowerCase()}?`}
        confirmLabel={toNotApproved ? 'Mark not approved' : 'Change approval'}
        tone={toNotApproved ? 'danger' : 'primary'}
        busy={update.isPending}
        onCancel={() => setConfirming(false)}
        onConfirm={() =>
          update.mutate(
            { id: supplier.id, approval: next, ...(reason.trim() ? { approvalReason: reason.trim() } : {}) },
            {
              onSuccess: () => setReason(''),
              onSettled: () => setConfirming(false),
            },
          )
        }
      >
        From {APPROVAL_LABELS[supplier.approval]} to {APPROVAL_LABELS[next]}. {MEANING[next]}
        {reason.trim() ? ` Reason: “${reason.trim()}”.` : ' No reason given; consider adding one for the audit trail.'}
      </ConfirmDialog>
    </div>
  );
}

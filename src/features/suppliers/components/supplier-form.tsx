import { useState, type FormEvent } from 'react';
import { APPROVAL_LABELS, APPROVAL_STATUSES, type ApprovalStatus, type SupplierDetail } from '../../../../shared/api/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateSupplier } from '../api/create-supplier.ts';
import { useUpdateSupplier } from '../api/update-supplier.ts';

const textarea = 'w-full rounded-md border border-rule bg-panel px-2.5 py-1.5 text-base text-ink focus:border-copper focus:outline-none aria-[invalid=true]:border-fail';

/**
 * New supplier (code, name, approval, notes), or the code/name/notes of an existing one
 * (`initial`); approval of an existing supplier changes through SupplierApproval instead.
 */
export function SupplierForm({ initial, onDone, onCancel }: { initial?: SupplierDetail; onDone: (s: SupplierDetail) => void; onCancel?: () => void }) {
  const [form, setForm] = useState({
    code: initial?.code ?? '',
    name: initial?.name ?? '',
    approval: (initial?.approval ?? 'approved') as ApprovalStatus,
    notes: initial?.notes ?? '',
  });
  const create = useCreateSupplier();
  const update = useUpdateSupplier();
  const mutation = initial ? update : create;
  const err = mutation.error instanceof ApiError ? mutation.error : null;
  const set = (k: keyof typeof form) => (e: { target: { value: string } }) => setForm((f) => ({ ...f, [k]: e.target.value }));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (initial) update.mutate({ id: initial.id, code: form.code, name: form.name, notes: form.notes || null }, { onSuccess: onDone });
    else create.mutate({ ...form, notes: form.notes || null }, { onSuccess: onDone });
  };

  return (
    <form onSubmit={submit} noValidate aria-label={initial ? 'Edit supplier' : 'New supplier'} className="grid gap-3">
      {err && !err.problem.errors?.length && <Notice tone="fail">{err.problem.detail}</Notice>}
      <TextField label="Code" name="code" value={form.code} onChange={set('code')} error={err?.fieldError('code')} hint="Short and unique, e.g. KLC" required />
      <TextField label="Name" name="name" value={form.name} onChange={set('name')} error={err?.fieldError('name')} required />
      {!initial && (
        <SelectField
          label="Approval"
          name="approval"
          value={form.approval}
          onChange={set('approval')}
          error={err?.fieldError('approval')}
          options={APPROVAL_STATUSES.map((a) => ({ value: a, label: APPROVAL_LABELS[a] }))}
        />
      )}
      <label className="flex flex-col gap-1 text-sm font-semibold text-ink-soft">
        Notes
        <textarea name="notes" rows={3} value={form.notes} onChange={set('notes')} aria-invalid={Boolean(err?.fieldError('notes'))} className={textarea} />
        {err?.fieldError('notes') && <span className="text-xs text-fail">✕ {err.fieldError('notes')}</span>}
      </label>
      <div className="flex justify-end gap-2">
        {onCancel && (
          <Button type="button" onClick={onCancel}>
            Cancel
          </Button>
        )}
        <Button type="submit" variant="primary" busy={mutation.isPending}>
          {initial ? 'Save changes' : 'Create supplier'}
        </Button>
      </div>
    </form>
  );
}

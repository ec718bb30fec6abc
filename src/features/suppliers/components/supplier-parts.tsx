import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import type { SupplierPartRow } from '../../../../shared/api/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useAddPartMapping } from '../api/add-part-mapping.ts';
import { useDeletePartMapping } from '../api/delete-part-mapping.ts';

export interface PartTypeOption {
  id: number;
  label: string;
}

/**
 * The supplier's part numbers and the part types of ours they map to; the Dock uses them to
 * fill the receiving form from a scanned label.
 */
export function SupplierParts({
  supplierId,
  parts,
  canEdit,
  partTypeOptions,
  partPath,
}: {
  supplierId: number;
  parts: SupplierPartRow[];
  canEdit: boolean;
  partTypeOptions: PartTypeOption[];
  partPath: (id: number) => string;
}) {
  const [form, setForm] = useState({ supplierPartNumber: '', partTypeId: '' });
  const [removing, setRemoving] = useState<SupplierPartRow | null>(null);
  const add = useAddPartMapping(supplierId);
  const remove = useDeletePartMapping(supplierId);
  const err = add.error instanceof ApiError ? add.error : null;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    add.mutate(
      { supplierPartNumber: form.supplierPartNumber, partTypeId: Number(form.partTypeId) },
      { onSuccess: () => setForm({ supplierPartNumber: '', partTypeId: form.partTypeId }) },
    );
  };

  return (
    <div className="flex flex-col gap-3">
      {parts.length === 0 ? (
        <p className="text-sm text-ink-faint">No supplier part numbers mapped yet.</p>
      ) : (
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Supplier part numbers</caption>
          <thead className="bg-paper text-left text-xs font-bold uppercase tracking-wide text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-1.5">Their part number</th>
              <th scope="col" className="px-2 py-1.5">Our part type</th>
              <th scope="col" className="px-2 py-1.5 text-right">Lots received</th>
              {canEdit && <th scope="col" className="px-2 py-1.5"><span className="sr-only">Remove</span></th>}
            </tr>
          </thead>
          <tbody>
            {parts.map((p) => (
              <tr key={p.id} className="border-b border-rule/70">
                <td className="num px-2 py-1 font-semibold">{p.supplierPartNumber}</td>
                <td className="px-2 py-1">
                  <Link to={partPath(p.partTypeId)} className="font-semibold text-copper-dark underline-offset-2 hover:underline">
                    {p.partNumber}
                  </Link>{' '}
                  <span className="text-ink-soft">
                    {p.polarity} · {p.partDescription}
                  </span>
                </td>
                <td className="num px-2 py-1 text-right">{p.lotCount}</td>
                {canEdit && (
                  <td className="px-2 py-1 text-right">
                    <Button variant="quiet" onClick={() => setRemoving(p)} aria-label={`Remove mapping ${p.supplierPartNumber}`}>
                      Remove
                    </Button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {remove.error instanceof ApiError && <Notice tone="fail">{remove.error.problem.detail}</Notice>}
      {canEdit && (
        <form onSubmit={submit} noValidate aria-label="New part mapping" className="grid gap-3 rounded-md border border-dashed border-rule p-3 sm:grid-cols-[1fr_1.4fr_auto] sm:items-start">
          {err && !err.problem.errors?.length && (
            <div className="sm:col-span-3">
              <Notice tone="fail">{err.problem.detail}</Notice>
            </div>
          )}
          <TextField
            label="Their part number"
            name="supplierPartNumber"
            value={form.supplierPartNumber}
            onChange={(e) => setForm((f) => ({ ...f, supplierPartNumber: e.target.value }))}
            error={err?.fieldError('supplierPartNumber')}
            hint="As printed on their label (1P)"
          />
          <SelectField
            label="Our part type"
            name="partTypeId"
            value={form.partTypeId}
            onChange={(e) => setForm((f) => ({ ...f, partTypeId: e.target.value }))}
            error={err?.fieldError('partTypeId')}
            options={[{ value: '', label: 'Choose a part type…' }, ...partTypeOptions.map((o) => ({ value: String(o.id), label: o.label }))]}
          />
          <Button type="submit" className="sm:mt-6" busy={add.isPending}>
            Map part number
          </Button>
        </form>
      )}
      <ConfirmDialog
        open={removing !== null}
        title={`Remove the mapping ${removing?.supplierPartNumber}?`}
        confirmLabel="Remove mapping"
        busy={remove.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={() => removing && remove.mutate(removing.id, { onSettled: () => setRemoving(null) })}
      >
        Scanning {removing?.supplierPartNumber} at the Dock will no longer fill in {removing?.partNumber}.
        {removing && removing.lotCount > 0
          ? ` ${removing.lotCount} lot${removing.lotCount === 1 ? ' was' : 's were'} received under it; they keep their part type.`
          : ''}
      </ConfirmDialog>
    </div>
  );
}

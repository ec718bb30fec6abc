import { useState, type FormEvent } from 'react';
import type { ContactRow } from '../../../../shared/api/catalog.ts';
import { Button } from '../../../components/ui/button.tsx';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useAddContact } from '../api/add-contact.ts';
import { useDeleteContact } from '../api/delete-contact.ts';
import { useUpdateContact } from '../api/update-contact.ts';

const EMPTY = { name: '', email: '', phone: '', duty: '' };
type ContactForm = typeof EMPTY;
const toForm = (c: ContactRow): ContactForm => ({ name: c.name, email: c.email, phone: c.phone ?? '', duty: c.duty ?? '' });

function ContactFields({ form, setForm, err }: { form: ContactForm; setForm: (f: ContactForm) => void; err: ApiError | null }) {
  const set = (k: keyof ContactForm) => (e: { target: { value: string } }) => setForm({ ...form, [k]: e.target.value });
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      <TextField label="Name" name="name" value={form.name} onChange={set('name')} error={err?.fieldError('name')} required />
      <TextField label="E-mail" name="email" type="email" value={form.email} onChange={set('email')} error={err?.fieldError('email')} required />
      <TextField label="Phone" name="phone" value={form.phone} onChange={set('phone')} error={err?.fieldError('phone')} />
      <TextField label="Handles" name="duty" value={form.duty} onChange={set('duty')} error={err?.fieldError('duty')} hint="e.g. quality, sales" />
    </div>
  );
}

const body = (f: ContactForm) => ({ name: f.name, email: f.email, phone: f.phone || null, duty: f.duty || null });

/** A supplier's contacts; quality engineers add, change and remove them. */
export function SupplierContacts({ supplierId, contacts, canEdit }: { supplierId: number; contacts: ContactRow[]; canEdit: boolean }) {
  const [adding, setAdding] = useState<ContactForm>(EMPTY);
  const [editing, setEditing] = useState<{ id: number; form: ContactForm } | null>(null);
  const [removing, setRemoving] = useState<ContactRow | null>(null);
  const add = useAddContact(supplierId);
  const update = useUpdateContact(supplierId);
  const remove = useDeleteContact(supplierId);
  const addErr = add.error instanceof ApiError ? add.error : null;
  const editErr = update.error instanceof ApiError ? update.error : null;
  const removeErr = remove.error instanceof ApiError ? remove.error : null;

  const submitAdd = (e: FormEvent) => {
    e.preventDefault();
    add.mutate(body(adding), { onSuccess: () => setAdding(EMPTY) });
  };
  const submitEdit = (e: FormEvent) => {
    e.preventDefault();
    if (editing) update.mutate({ contactId: editing.id, ...body(editing.form) }, { onSuccess: () => setEditing(null) });
  };

  return (
    <div className="flex flex-col gap-3">
      {contacts.length === 0 ? (
        <p className="text-sm text-ink-faint">No contacts yet.</p>
      ) : (
        <ul className="flex flex-col divide-y divide-rule/70" aria-label="Contacts">
          {contacts.map((c) =>
            editing?.id === c.id ? (
              <li key={c.id} className="py-2">
                <form onSubmit={submitEdit} noValidate aria-label={`Edit contact ${c.name}`} className="flex flex-col gap-2">
                  {editErr && !editErr.problem.errors?.length && <Notice tone="fail">{editErr.problem.detail}</Notice>}
                  <ContactFields form={editing.form} setForm={(form) => setEditing({ id: c.id, form })} err={editErr} />
                  <div className="flex justify-end gap-2">
                    <Button type="button" onClick={() => setEditing(null)}>
                      Cancel
                    </Button>
                    <Button type="submit" variant="primary" busy={update.isPending}>
                      Save contact
                    </Button>
                  </div>
                </form>
              </li>
            ) : (
              <li key={c.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2 text-sm">
                <span className="min-w-36 font-semibold text-ink">{c.name}</span>
                <a href={`mailto:${c.email}`} className="text-copper-dark underline-offset-2 hover:underline">
                  {c.email}
                </a>
                {c.phone && <span className="num text-ink-soft">{c.phone}</span>}
                {c.duty && <span className="rounded bg-paper px-1.5 py-0.5 text-xs text-ink-soft">{c.duty}</span>}
                {canEdit && (
                  <span className="ml-auto flex gap-1">
                    <Button
                      variant="quiet"
                      onClick={() => {
                        update.reset();
                        setEditing({ id: c.id, form: toForm(c) });
                      }}
                    >
                      Edit
                    </Button>
                    <Button variant="quiet" onClick={() => setRemoving(c)}>
                      Remove
                    </Button>
                  </span>
                )}
              </li>
            ),
          )}
        </ul>
      )}
      {removeErr && <Notice tone="fail">{removeErr.problem.detail}</Notice>}
      {canEdit && (
        <form onSubmit={submitAdd} noValidate aria-label="New contact" className="flex flex-col gap-2 rounded-md border border-dashed border-rule p-3">
          <p className="text-sm font-bold text-ink">Add a contact</p>
          {addErr && !addErr.problem.errors?.length && <Notice tone="fail">{addErr.problem.detail}</Notice>}
          <ContactFields form={adding} setForm={setAdding} err={addErr} />
          <div className="flex justify-end">
            <Button type="submit" busy={add.isPending}>
              Add contact
            </Button>
          </div>
        </form>
      )}
      <ConfirmDialog
        open={removing !== null}
        title={`Remove ${removing?.name}?`}
        confirmLabel="Remove contact"
        busy={remove.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={() => removing && remove.mutate(removing.id, { onSettled: () => setRemoving(null) })}
      >
        {removing?.email} will no longer be offered for nonconformance reports. The audit trail keeps a record of the contact.
      </ConfirmDialog>
    </div>
  );
}

import { useState, type FormEvent } from 'react';
import { ROLES, ROLE_LABELS, type Role } from '../../../../shared/api/roles.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useCreateUser } from '../api/create-user.ts';

const EMPTY = { name: '', email: '', role: 'inspector' as Role, password: '' };

/** Creates a user. On error the typed values stay and each bad field says why. */
export function CreateUserForm() {
  const [form, setForm] = useState(EMPTY);
  const [created, setCreated] = useState<string | null>(null);
  const mutation = useCreateUser();
  const err = mutation.error instanceof ApiError ? mutation.error : null;
  const set = (k: keyof typeof EMPTY) => (e: { target: { value: string } }) => setForm((f) => ({ ...f, [k]: e.target.value }));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setCreated(null);
    mutation.mutate(form, {
      onSuccess: (u) => {
        setCreated(`${u.name} (${u.email}) can now sign in as ${ROLE_LABELS[u.role].toLowerCase()}.`);
        setForm(EMPTY);
      },
    });
  };

  return (
    <form onSubmit={submit} noValidate className="grid gap-3" aria-label="New user">
      {created && <Notice tone="pass" title="User created">{created}</Notice>}
      {err && !err.problem.errors?.length && <Notice tone="fail">{err.problem.detail}</Notice>}
      <TextField label="Name" name="name" value={form.name} onChange={set('name')} error={err?.fieldError('name')} required />
      <TextField label="E-mail" name="email" type="email" value={form.email} onChange={set('email')} error={err?.fieldError('email')} required />
      <SelectField
        label="Role"
        name="role"
        value={form.role}
        onChange={set('role')}
        error={err?.fieldError('role')}
        options={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
      />
      <TextField
        label="Initial password"
        name="password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters, not the name or e-mail, not a common password. Hand it over in person."
        value={form.password}
        onChange={set('password')}
        error={err?.fieldError('password')}
        required
      />
      <Button type="submit" variant="primary" busy={mutation.isPending}>
        Create user
      </Button>
    </form>
  );
}

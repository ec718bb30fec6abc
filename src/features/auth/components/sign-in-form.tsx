import { useState, type FormEvent } from 'react';
import { ApiError } from '../../../lib/api-client.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { Notice } from '../../../components/ui/notice.tsx';
import { useLogin } from '../api/login.ts';

export function SignInForm({ onSignedIn }: { onSignedIn?: () => void }) {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const loginMutation = useLogin();
  const err = loginMutation.error instanceof ApiError ? loginMutation.error : null;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    loginMutation.mutate({ email: email.trim(), password }, { onSuccess: () => onSignedIn?.() });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      {loginMutation.error && (
        <Notice tone="fail" title="Sign-in failed">
          {err ? err.problem.detail : 'The server could not be reached. Check the connection and try again.'}
        </Notice>
      )}
      <TextField
        label="E-mail"
        type="email"
        name="email"
        autoComplete="username"
        autoFocus
        required
        value={email}
        onChange={(e) => setEmail(e.target.value)}
        error={err?.fieldError('email')}
      />
      <TextField
        label="Password"
        type="password"
        name="password"
        autoComplete="current-password"
        required
        value={password}
        onChange={(e) => setPassword(e.target.value)}
        error={err?.fieldError('password')}
      />
      <Button type="submit" variant="primary" busy={loginMutation.isPending} className="mt-1 py-2">
        Sign in
      </Button>
    </form>
  );
}

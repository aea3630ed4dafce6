import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { AuthCard } from '../layout/auth-card';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import { useRequestPasswordReset } from '@/features/auth/api/request-password-reset';
import { paths } from '../paths';

export function Component() {
  const [email, setEmail] = useState('');
  const reset = useRequestPasswordReset();
  const err = reset.error instanceof ApiError ? reset.error : null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    reset.mutate(email);
  };
  return (
    <AuthCard title="Reset your password">
      {reset.isSuccess ? (
        <p role="status" className="text-sm text-ink">{reset.data.message} The link is valid for an hour.</p>
      ) : (
        <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
          <TextField label="E-mail" type="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} error={err?.fieldError('email')} />
          {reset.error && !err?.details ? <ErrorNote error={reset.error} /> : null}
          <Button type="submit" disabled={reset.isPending}>Send reset link</Button>
        </form>
      )}
      <Link to={paths.signIn} className="mt-4 block text-sm text-moss hover:underline">Back to sign-in</Link>
    </AuthCard>
  );
}

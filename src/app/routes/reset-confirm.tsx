import { useState, type FormEvent } from 'react';
import { Link, useParams } from 'react-router';
import { AuthCard } from '../layout/auth-card';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import { useConfirmPasswordReset } from '@/features/auth/api/confirm-password-reset';
import { paths } from '../paths';

export function Component() {
  const { token = '' } = useParams();
  const [password, setPassword] = useState('');
  const confirm = useConfirmPasswordReset();
  const err = confirm.error instanceof ApiError ? confirm.error : null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    confirm.mutate({ token, password });
  };
  return (
    <AuthCard title="Choose a new password">
      {confirm.isSuccess ? (
        <p role="status" className="text-sm">Your password is changed and other sign-ins were ended. <Link className="text-moss underline" to={paths.signIn}>Sign in</Link></p>
      ) : (
        <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
          <TextField label="New password" type="password" autoComplete="new-password" value={password} onChange={(e) => setPassword(e.target.value)} error={err?.fieldError('password')} hint="At least 10 characters." />
          {confirm.error && !err?.details ? <ErrorNote error={confirm.error} /> : null}
          <Button type="submit" disabled={confirm.isPending}>Set password</Button>
        </form>
      )}
    </AuthCard>
  );
}

import { useState, type FormEvent } from 'react';
import { Link } from 'react-router';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import { useSignIn } from '../api/sign-in';
import { paths } from '@/app/paths';

export function SignInForm({ onDone }: { onDone: () => void }) {
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const signIn = useSignIn();
  const err = signIn.error instanceof ApiError ? signIn.error : null;

  function submit(e: FormEvent) {
    e.preventDefault();
    signIn.mutate({ email, password }, { onSuccess: onDone });
  }

  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
      <TextField label="E-mail" type="email" autoComplete="username" value={email} onChange={(e) => setEmail(e.target.value)} error={err?.fieldError('email')} required />
      <TextField label="Password" type="password" autoComplete="current-password" value={password} onChange={(e) => setPassword(e.target.value)} error={err?.fieldError('password')} required />
      {signIn.error && !err?.details ? <ErrorNote error={signIn.error} /> : null}
      <Button type="submit" disabled={signIn.isPending}>{signIn.isPending ? 'Signing in…' : 'Sign in'}</Button>
      <Link to={paths.resetRequest} className="text-sm text-moss hover:underline">Forgot your password?</Link>
    </form>
  );
}

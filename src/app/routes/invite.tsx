import { useState, type FormEvent } from 'react';
import { useNavigate, useParams } from 'react-router';
import { AuthCard } from '../layout/auth-card';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { ErrorNote, QueryState } from '@/components/query-state';
import { ROLE_LABELS } from '@shared/roles';
import { useInvitation } from '@/features/auth/api/get-invitation';
import { useAcceptInvitation } from '@/features/auth/api/accept-invitation';
import { paths } from '../paths';

export function Component() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation();
  const [name, setName] = useState('');
  const [password, setPassword] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    accept.mutate({ token, name: name || undefined, password }, { onSuccess: () => navigate(paths.planner, { replace: true }) });
  };
  const inv = invitation.data;
  return (
    <AuthCard title="Join a studio">
      <QueryState isPending={invitation.isPending} error={invitation.error} label="invitation">
        {inv ? (
          <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
            <p className="text-sm">
              <strong>{inv.studioName}</strong> invites <strong>{inv.email}</strong> as {ROLE_LABELS[inv.role].toLowerCase()}.
            </p>
            {inv.hasAccount ? null : <TextField label="Your name" autoComplete="name" value={name} onChange={(e) => setName(e.target.value)} />}
            <TextField
              label={inv.hasAccount ? 'Your existing password' : 'Choose a password'}
              type="password"
              autoComplete={inv.hasAccount ? 'current-password' : 'new-password'}
              value={password}
              onChange={(e) => setPassword(e.target.value)}
              hint={inv.hasAccount ? undefined : 'At least 10 characters.'}
            />
            <ErrorNote error={accept.error} />
            <Button type="submit" disabled={accept.isPending}>Accept and join</Button>
          </form>
        ) : null}
      </QueryState>
    </AuthCard>
  );
}

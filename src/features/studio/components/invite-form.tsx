import { useState, type FormEvent } from 'react';
import { ROLES, ROLE_LABELS, type Role } from '@shared/roles';
import { Button } from '@/components/button';
import { TextField } from '@/components/text-field';
import { SelectField } from '@/components/select-field';
import { ErrorNote } from '@/components/query-state';
import { ApiError } from '@/lib/api-client';
import { useCreateInvitation } from '../api/create-invitation';

export function InviteForm({ studioId }: { studioId: string }) {
  const [email, setEmail] = useState('');
  const [role, setRole] = useState<Role>('photographer');
  const invite = useCreateInvitation(studioId);
  const err = invite.error instanceof ApiError ? invite.error : null;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    invite.mutate({ email, role }, { onSuccess: () => setEmail('') });
  };
  return (
    <form onSubmit={submit} className="flex flex-wrap items-end gap-3" noValidate>
      <TextField label="E-mail" type="email" value={email} onChange={(e) => setEmail(e.target.value)} error={err?.fieldError('email')} className="min-w-64" />
      <SelectField label="Role" value={role} onChange={(e) => setRole(e.target.value as Role)}>
        {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
      </SelectField>
      <Button type="submit" disabled={invite.isPending}>Send invitation</Button>
      {invite.isSuccess ? <p role="status" className="w-full text-sm text-moss">Invitation sent. The link is valid for 7 days and works once.</p> : null}
      {invite.error && !err?.details ? <div className="w-full"><ErrorNote error={invite.error} /></div> : null}
    </form>
  );
}

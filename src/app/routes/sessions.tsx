import { useState } from 'react';
import { useNavigate } from 'react-router';
import { Button } from '@/components/button';
import { EmptyState, PageHeader, QueryState } from '@/components/query-state';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useSessions } from '@/features/sessions/api/get-sessions';
import { useCreateSession } from '@/features/sessions/api/create-session';
import { SessionsTable } from '@/features/sessions/components/sessions-table';
import { SessionForm } from '@/features/sessions/components/session-form';
import { paths } from '../paths';
import { RetoucherElsewhere } from '../layout/retoucher-elsewhere';

export function Component() {
  const { role } = useActiveStudio();
  return role === 'retoucher' ? <RetoucherElsewhere title="Sessions" /> : <Sessions />;
}

function Sessions() {
  const { studioId, canEdit } = useActiveStudio();
  const sessions = useSessions(studioId);
  const create = useCreateSession(studioId);
  const navigate = useNavigate();
  const [adding, setAdding] = useState(false);
  return (
    <>
      <PageHeader title="Sessions">
        {canEdit && !adding ? <Button onClick={() => setAdding(true)}>New session</Button> : null}
      </PageHeader>
      <p className="mb-6 max-w-prose text-sm text-slate">
        One dated shoot each: its subject, notes, card imports and the stacks sorted from them.
      </p>
      {adding ? (
        <div className="mb-6">
          <h2 className="mb-2 text-lg font-semibold">New session</h2>
          <SessionForm
            submitLabel="Create session"
            pending={create.isPending}
            error={create.error}
            onSubmit={(v) => create.mutate(v, { onSuccess: (s) => navigate(paths.session(s.id)) })}
            onCancel={() => { create.reset(); setAdding(false); }}
          />
        </div>
      ) : null}
      <QueryState isPending={sessions.isPending} error={sessions.error} label="sessions">
        {sessions.data?.length ? (
          <SessionsTable sessions={sessions.data} sessionHref={paths.session} />
        ) : (
          <EmptyState title="No sessions yet">
            {canEdit ? 'Create one for your next shoot, then import its card.' : 'Owners and photographers create sessions; they will show here.'}
          </EmptyState>
        )}
      </QueryState>
    </>
  );
}

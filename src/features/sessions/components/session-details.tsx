import { useState } from 'react';
import type { SessionRow } from '@shared/schemas/session-views';
import { Button } from '@/components/button';
import { PageHeader } from '@/components/query-state';
import { count } from '@/lib/units';
import { useUpdateSession } from '../api/update-session';
import { shootDate } from '../lib/format';
import { SessionForm } from './session-form';

/** The session's header: title, date, subject, place and notes, editable by owners and photographers. */
export function SessionDetails({ studioId, session, canEdit }: { studioId: string; session: SessionRow; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  const update = useUpdateSession(studioId, session.id);
  return (
    <>
      <PageHeader title={session.title}>
        {canEdit && !editing ? <Button variant="secondary" onClick={() => setEditing(true)}>Edit details</Button> : null}
      </PageHeader>
      {editing ? (
        <div className="mb-6">
          <SessionForm
            initial={{ title: session.title, shootDate: session.shootDate, subject: session.subject, location: session.location, notes: session.notes }}
            submitLabel="Save details"
            pending={update.isPending}
            error={update.error}
            onSubmit={(v) => update.mutate(v, { onSuccess: () => setEditing(false) })}
            onCancel={() => { update.reset(); setEditing(false); }}
          />
        </div>
      ) : (
        <dl className="mb-6 grid grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr_auto_1fr]">
          <dt className="text-slate">Date</dt><dd className="num">{shootDate(session.shootDate)}</dd>
          <dt className="text-slate">Subject</dt><dd>{session.subject || '—'}</dd>
          <dt className="text-slate">Location</dt><dd>{session.location || '—'}</dd>
          <dt className="text-slate">On the card</dt>
          <dd className="num">{count(session.frameCount)} frames · {count(session.stackCount)} stacks · {count(session.looseCount)} loose</dd>
          {session.notes ? (<><dt className="text-slate">Notes</dt><dd className="whitespace-pre-line sm:col-span-3">{session.notes}</dd></>) : null}
        </dl>
      )}
    </>
  );
}

import { ErrorNote, PageHeader, QueryState } from '@/components/query-state';
import { Button } from '@/components/button';
import { useActiveStudio } from '@/features/auth/hooks/use-active-studio';
import { useMe } from '@/features/auth/api/get-me';
import { useMembers } from '@/features/studio/api/get-members';
import { useInvitations } from '@/features/studio/api/get-invitations';
import { useRevokeInvitation } from '@/features/studio/api/revoke-invitation';
import { MembersTable } from '@/features/studio/components/members-table';
import { InviteForm } from '@/features/studio/components/invite-form';
import { CaughtMail } from '@/features/studio/components/caught-mail';
import { CheckThresholdsSection } from '@/features/checks/components/check-thresholds-section';
import { ROLE_LABELS } from '@shared/roles';

export function Component() {
  const { studioId, studioName, isOwner, canEdit } = useActiveStudio();
  const { data: me } = useMe();
  const members = useMembers(studioId);
  const invitations = useInvitations(studioId, isOwner);
  const revoke = useRevokeInvitation(studioId);

  return (
    <>
      <PageHeader title={studioName} />
      <section aria-labelledby="members-h" className="mb-10">
        <h2 id="members-h" className="mb-3 text-lg font-semibold">Members</h2>
        <QueryState isPending={members.isPending} error={members.error} label="members">
          <MembersTable studioId={studioId} members={members.data ?? []} isOwner={isOwner} myUserId={me?.id ?? ''} />
        </QueryState>
      </section>
      <CheckThresholdsSection studioId={studioId} canEdit={canEdit} />
      {isOwner ? (
        <>
          <section aria-labelledby="invite-h" className="mb-10">
            <h2 id="invite-h" className="mb-3 text-lg font-semibold">Invite someone</h2>
            <InviteForm studioId={studioId} />
            <h3 className="mt-6 mb-1 text-sm font-semibold">Open invitations</h3>
            <QueryState isPending={invitations.isPending} error={invitations.error} label="invitations">
              {invitations.data?.length ? null : <p className="text-sm text-slate">No invitation is waiting for an answer.</p>}
            </QueryState>
            <ErrorNote error={revoke.error} />
            {invitations.data?.length ? (
              <ul className="mt-1 flex flex-col gap-1 text-sm" aria-label="Open invitations">
                {invitations.data.map((i) => (
                  <li key={i.id} className="flex items-center gap-3">
                    <span>{i.email}</span>
                    <span className="text-slate">{ROLE_LABELS[i.role]} · expires {new Date(i.expiresAt).toLocaleDateString()}</span>
                    <Button variant="quiet" disabled={revoke.isPending} onClick={() => revoke.mutate(i.id)} aria-label={`Withdraw the invitation to ${i.email}`}>Withdraw</Button>
                  </li>
                ))}
              </ul>
            ) : null}
          </section>
          <section aria-labelledby="mail-h">
            <h2 id="mail-h" className="mb-1 text-lg font-semibold">Caught mail</h2>
            <p className="mb-3 text-sm text-slate">In this installation e-mail goes to a local mail catcher instead of the internet.</p>
            <CaughtMail studioId={studioId} />
          </section>
        </>
      ) : null}
    </>
  );
}

// Bundle downloads by the retoucher a stack is handed to: each one is in the audit trail, and
// the person who handed the stack off is e-mailed at the first download of a hand-off or link.
import { getDataSource } from '../lib/data-source';
import type { Role } from '../../shared/roles';
import type { ShootSession, Stack } from '../entities/session';
import { stackForMember } from './stack-access';
import { countShareDownload, type OpenedLink } from './share-link-service';
import { openStackBundle, type OpenedBundle } from './handoff-bundle';
import { appUrl, handedOffBy, queueMails, quote, recordHandoffEvent, type HandoffActor } from './handoff-steps';

async function noteDownload(stack: Stack, session: ShootSession, actor: HandoffActor, detail: Record<string, unknown>, first: () => Promise<boolean>) {
  const eventId = await getDataSource().transaction((tx) => recordHandoffEvent(tx, stack.id, actor, 'bundle-downloaded', detail));
  if (!(await first())) return;
  const photographer = await handedOffBy(stack.id);
  if (!photographer) return;
  await queueMails(eventId, [{
    to: photographer.email,
    subject: `Downloaded: ${stack.name} by ${actor.label}`,
    text: `${actor.label} downloaded the bundle of ${quote(stack.name)} (${session.title}). You will hear again when the merged result is in.\n\n` +
      `${appUrl(`/sessions/${session.id}/stacks/${stack.id}`)}\n`,
  }]);
}

/** A member's download; counted as the retoucher's when the stack is handed to this person. */
export async function downloadAsMember(member: { studioId: string; role: Role }, user: { id: string; label: string }, stackId: string): Promise<OpenedBundle> {
  const { stack, session } = await stackForMember(member, user.id, stackId);
  const bundle = await openStackBundle(stack, user.id);
  if (stack.handedToUserId === user.id && stack.handedOffAt) {
    const since = stack.handedOffAt;
    await noteDownload(stack, session, { userId: user.id, label: user.label }, { via: 'member', bytes: bundle.sizeBytes }, async () => {
      const [row]: { n: number }[] = await getDataSource().query(
        `SELECT count(*)::int AS n FROM stack_events WHERE stack_id = $1 AND action = 'bundle-downloaded' AND actor_id = $2 AND at >= $3`,
        [stack.id, user.id, since],
      );
      return row.n === 1;
    });
  }
  return bundle;
}

/** A download through a share link: counted on the link. */
export async function downloadThroughLink(opened: OpenedLink): Promise<OpenedBundle> {
  const { link, stack, session } = opened;
  const bundle = await openStackBundle(stack, link.createdBy);
  const count = await countShareDownload(link.id);
  await noteDownload(stack, session, { userId: null, label: `${link.email} (share link)` }, { via: 'share-link', shareLinkId: link.id, downloadCount: count, bytes: bundle.sizeBytes }, async () => count === 1);
  return bundle;
}

// The hand-off steps of a stack (ready → handed-off → merged → archived, and taking a hand-off
// back). Only these functions move a stack past ready; each checks the state under the session's
// lock, leaves an audit row, and queues the e-mails after the step is committed.
import { getDataSource } from '../lib/data-source';
import { Conflict, NotFound } from '../lib/errors';
import { ShareLink } from '../entities/handoff';
import { Stack } from '../entities/session';
import { Studio } from '../entities/studio';
import { User } from '../entities/user';
import type { HandOffInput, NewShareLink } from '../../shared/schemas/handoff';
import { handOffSchema } from '../../shared/schemas/handoff';
import { findMembership } from './membership-service';
import { fieldError } from './stack-edit-steps';
import { issueShareLink, revokeLinksOfStack } from './share-link-service';
import {
  appUrl, assertStep, queueMails, quote, recordHandoffEvent, utcText, withLockedStack, type HandoffActor, type Mail,
} from './handoff-steps';
import { prepareBundleForHandoff } from './handoff-bundle';

export interface Editor {
  userId: string;
  label: string;
  email: string;
}

const actorOf = (e: Editor): HandoffActor => ({ userId: e.userId, label: e.label });

/** A retoucher of this studio, or a 422 on the field saying why that person cannot take it. */
async function retoucherMember(studioId: string, userId: string): Promise<User> {
  const membership = await findMembership(studioId, userId);
  const user = membership ? await getDataSource().getRepository(User).findOneBy({ id: userId }) : null;
  if (!membership || !user) throw fieldError('retoucherUserId', 'That person is not a member of this studio. Hand it off by e-mail instead.');
  if (membership.role !== 'retoucher') {
    throw fieldError('retoucherUserId', `${user.name || user.email} is a ${membership.role} here, not a retoucher. Pick a retoucher, or change their role first.`);
  }
  return user;
}

/** ready → handed-off, to a retoucher member or (by e-mail, with a share link) to an outside one. */
export async function handOffStack(studioId: string, stackId: string, editor: Editor, body: HandOffInput): Promise<{ shareLink: NewShareLink | null }> {
  const input = handOffSchema.parse(body);
  const member = input.to === 'member' ? await retoucherMember(studioId, input.retoucherUserId) : null;
  const studio = await getDataSource().getRepository(Studio).findOneByOrFail({ id: studioId });
  const done = await withLockedStack(studioId, stackId, async ({ tx, stack, session }) => {
    assertStep('hand-off', stack);
    const handedOffAt = new Date();
    await tx.getRepository(Stack).update({ id: stack.id }, {
      state: 'handed-off',
      handedToUserId: member?.id ?? null,
      handedToEmail: member ? null : input.to === 'email' ? input.email : null,
      handedOffAt,
      mergedAt: null,
    });
    const issued = input.to === 'email'
      ? await issueShareLink(tx, { studioId, stackId: stack.id, email: input.email, expiryDays: input.expiryDays, createdBy: editor.userId })
      : null;
    const to = member ? { kind: 'member', userId: member.id, name: member.name, email: member.email } : { kind: 'email', email: input.to === 'email' ? input.email : '' };
    const eventId = await recordHandoffEvent(tx, stack.id, actorOf(editor), 'handed-off', {
      to, ...(issued ? { shareLinkId: issued.link.id, expiresAt: issued.link.expiresAt.toISOString() } : {}),
    });
    return { stack, session, issued, eventId };
  });

  const { stack, session, issued, eventId } = done;
  const what = `${quote(stack.name)} (${session.title}, ${session.shootDate})`;
  const toName = member ? member.name || member.email : input.to === 'email' ? input.email : '';
  const mails: Mail[] = [{
    to: editor.email,
    subject: `Handed off: ${stack.name} to ${toName}`,
    text: `You handed ${what} to ${toName}. You will get an e-mail when they download the bundle and when the merged result is in.\n\n` +
      `${appUrl(`/sessions/${session.id}/stacks/${stack.id}`)}\n`,
  }];
  if (member) {
    mails.push({
      to: member.email,
      subject: `A stack to merge from ${studio.name}: ${stack.name}`,
      text: `${editor.label} handed you ${what} in ${studio.name}.\n\nDownload the bundle and send back the merged result here:\n${appUrl(`/handoffs?stack=${stack.id}`)}\n`,
    });
  } else if (issued) {
    mails.push({
      to: issued.link.email,
      subject: `Frames to merge from ${studio.name}: ${stack.name}`,
      text: `${editor.label} of ${studio.name} sent you ${what} to merge.\n\n` +
        `Open this link to see the contact sheet, download the bundle and upload the merged result (valid until ${utcText(issued.link.expiresAt)}):\n` +
        `${issued.shown.url}\n\nKeep the link to yourself: anyone who has it can download the frames.\n`,
    });
  }
  await queueMails(eventId, mails);
  await prepareBundleForHandoff(stack.id, editor.userId);
  return { shareLink: issued?.shown ?? null };
}

/** handed-off → ready: the retoucher loses access, and every share link of the stack is revoked. */
export async function takeBackStack(studioId: string, stackId: string, editor: Editor): Promise<void> {
  const done = await withLockedStack(studioId, stackId, async ({ tx, stack }) => {
    assertStep('take-back', stack);
    const revoked = await revokeLinksOfStack(tx, stack.id);
    const formerUser = stack.handedToUserId ? await tx.getRepository(User).findOneBy({ id: stack.handedToUserId }) : null;
    const formerEmail = formerUser?.email ?? stack.handedToEmail;
    await tx.getRepository(Stack).update({ id: stack.id }, { state: 'ready', handedToUserId: null, handedToEmail: null, handedOffAt: null });
    const eventId = await recordHandoffEvent(tx, stack.id, actorOf(editor), 'taken-back', {
      from: formerUser ? { kind: 'member', userId: formerUser.id, name: formerUser.name, email: formerUser.email } : { kind: 'email', email: formerEmail },
      shareLinksRevoked: revoked,
    });
    return { stack, formerEmail, eventId };
  });
  if (done.formerEmail) {
    await queueMails(done.eventId, [{
      to: done.formerEmail,
      subject: `Hand-off withdrawn: ${done.stack.name}`,
      text: `${editor.label} took back ${quote(done.stack.name)}. Its bundle and share links no longer open for you; there is nothing more to do for it.\n`,
    }]);
  }
}

/** merged → archived. */
export async function archiveStack(studioId: string, stackId: string, editor: Editor): Promise<void> {
  await withLockedStack(studioId, stackId, async ({ tx, stack }) => {
    assertStep('archive', stack);
    await tx.getRepository(Stack).update({ id: stack.id }, { state: 'archived' });
    await recordHandoffEvent(tx, stack.id, actorOf(editor), 'archived', {});
  });
}

/** Another link for the outside retoucher the stack is handed to (the first one lost, say). */
export async function addShareLink(studioId: string, stackId: string, editor: Editor, expiryDays: number): Promise<NewShareLink> {
  const studio = await getDataSource().getRepository(Studio).findOneByOrFail({ id: studioId });
  const done = await withLockedStack(studioId, stackId, async ({ tx, stack }) => {
    if (stack.state !== 'handed-off') throw new Conflict(`${quote(stack.name)} is ${stack.state}; share links can only be made while a stack is handed off.`);
    if (!stack.handedToEmail) throw fieldError('expiryDays', `${quote(stack.name)} is handed to a studio member, who needs no share link.`);
    const issued = await issueShareLink(tx, { studioId, stackId: stack.id, email: stack.handedToEmail, expiryDays, createdBy: editor.userId });
    const eventId = await recordHandoffEvent(tx, stack.id, actorOf(editor), 'share-link-created', {
      shareLinkId: issued.link.id, email: issued.link.email, expiresAt: issued.link.expiresAt.toISOString(),
    });
    return { stack, issued, eventId };
  });
  await queueMails(done.eventId, [{
    to: done.issued.link.email,
    subject: `A new link to ${done.stack.name} from ${studio.name}`,
    text: `${editor.label} of ${studio.name} made a new link for ${quote(done.stack.name)} (valid until ${utcText(done.issued.link.expiresAt)}):\n${done.issued.shown.url}\n`,
  }]);
  return done.issued.shown;
}

export async function revokeShareLink(studioId: string, stackId: string, linkId: string, editor: Editor): Promise<void> {
  await withLockedStack(studioId, stackId, async ({ tx, stack }) => {
    const link = /^[0-9a-f-]{36}$/i.test(linkId) ? await tx.getRepository(ShareLink).findOneBy({ id: linkId, stackId: stack.id, studioId }) : null;
    if (!link) throw new NotFound('No such share link on this stack.');
    if (link.revokedAt) return;
    await tx.getRepository(ShareLink).update({ id: link.id }, { revokedAt: new Date() });
    await recordHandoffEvent(tx, stack.id, actorOf(editor), 'share-link-revoked', { shareLinkId: link.id, email: link.email });
  });
}


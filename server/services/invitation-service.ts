import { IsNull } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { env } from '../lib/env';
import { Conflict, Forbidden, Gone, NotFound } from '../lib/errors';
import { sendMail } from '../lib/mailer';
import { hashPassword, verifyPassword } from '../lib/passwords';
import { hashToken, newLinkToken } from '../lib/tokens';
import { Invitation, Membership, Studio } from '../entities/studio';
import { User } from '../entities/user';
import type { Role } from '../../shared/roles';
import { ROLE_LABELS } from '../../shared/roles';

export const INVITATION_TTL_MS = 7 * 24 * 3600 * 1000;

export async function createInvitation(studioId: string, invitedBy: string, email: string, role: Role) {
  const ds = getDataSource();
  const existingMember = await ds
    .getRepository(Membership)
    .createQueryBuilder('m')
    .innerJoin(User, 'u', 'u.id = m.user_id')
    .where('m.studio_id = :studioId AND u.email = :email', { studioId, email })
    .getOne();
  if (existingMember) throw new Conflict(`${email} is already a member of this studio.`);
  const studio = await ds.getRepository(Studio).findOneByOrFail({ id: studioId });
  const { token, tokenHash } = newLinkToken();
  const invitation = await ds.getRepository(Invitation).save(
    ds.getRepository(Invitation).create({
      studioId, email, role, tokenHash, invitedBy, expiresAt: new Date(Date.now() + INVITATION_TTL_MS),
    }),
  );
  await sendMail({
    to: email,
    subject: `You are invited to ${studio.name} on Lamella`,
    text:
      `You have been invited to join the studio "${studio.name}" on Lamella as ${ROLE_LABELS[role].toLowerCase()}.\n\n` +
      `Open this link to accept (valid for 7 days, usable once):\n${env().PUBLIC_URL}/invite/${token}\n\n` +
      `If you did not expect this, ignore this message.`,
  });
  return { id: invitation.id, email, role, expiresAt: invitation.expiresAt.toISOString() };
}

export async function listPendingInvitations(studioId: string) {
  const rows = await getDataSource()
    .getRepository(Invitation)
    .find({ where: { studioId, acceptedAt: IsNull(), revokedAt: IsNull() }, order: { createdAt: 'DESC' } });
  return rows
    .filter((i) => i.expiresAt.getTime() > Date.now())
    .map((i) => ({ id: i.id, email: i.email, role: i.role, expiresAt: i.expiresAt.toISOString() }));
}

export async function revokeInvitation(studioId: string, invitationId: string) {
  const res = await getDataSource()
    .getRepository(Invitation)
    .update({ id: invitationId, studioId, acceptedAt: IsNull() }, { revokedAt: new Date() });
  if (!res.affected) throw new NotFound('No such pending invitation.');
}

async function usableInvitation(token: string): Promise<Invitation> {
  const inv = await getDataSource().getRepository(Invitation).findOneBy({ tokenHash: hashToken(token) });
  if (!inv) throw new NotFound('This invitation link is not valid.');
  if (inv.acceptedAt) throw new Gone('This invitation has already been used.');
  if (inv.revokedAt) throw new Gone('This invitation was withdrawn.');
  if (inv.expiresAt.getTime() <= Date.now()) throw new Gone('This invitation has expired. Ask the studio owner for a new one.');
  return inv;
}

export async function describeInvitation(token: string) {
  const inv = await usableInvitation(token);
  const ds = getDataSource();
  const studio = await ds.getRepository(Studio).findOneByOrFail({ id: inv.studioId });
  const hasAccount = (await ds.getRepository(User).countBy({ email: inv.email })) > 0;
  return { studioName: studio.name, email: inv.email, role: inv.role, hasAccount, expiresAt: inv.expiresAt.toISOString() };
}

/**
 * Accepts an invitation: an existing account proves itself with its password, a new one is created.
 * Single use: the invitation row is locked and marked accepted in the same transaction.
 */
export async function acceptInvitation(token: string, input: { name?: string; password: string }): Promise<User> {
  return getDataSource().transaction(async (tx) => {
    const inv = await tx
      .getRepository(Invitation)
      .createQueryBuilder('i')
      .where('i.token_hash = :h', { h: hashToken(token) })
      .setLock('pessimistic_write')
      .getOne();
    if (!inv) throw new NotFound('This invitation link is not valid.');
    if (inv.acceptedAt || inv.revokedAt || inv.expiresAt.getTime() <= Date.now()) {
      throw new Gone('This invitation can no longer be used.');
    }
    const users = tx.getRepository(User);
    let user = await users.findOneBy({ email: inv.email });
    if (user) {
      if (!(await verifyPassword(user.passwordHash, input.password))) {
        throw new Forbidden('That password does not match the existing account for this e-mail.');
      }
    } else {
      if (input.password.length < 10) throw new Conflict('Use at least 10 characters for the password.');
      user = await users.save(
        users.create({ email: inv.email, name: input.name ?? inv.email.split('@')[0], passwordHash: await hashPassword(input.password) }),
      );
    }
    await tx.createQueryBuilder().insert().into(Membership).values({ studioId: inv.studioId, userId: user.id, role: inv.role }).orIgnore().execute();
    await tx.getRepository(Invitation).update({ id: inv.id }, { acceptedAt: new Date() });
    await users.update({ id: user.id }, { lastStudioId: inv.studioId });
    user.lastStudioId = inv.studioId;
    return user;
  });
}

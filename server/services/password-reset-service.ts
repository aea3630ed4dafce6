import { getDataSource } from '../lib/data-source';
import { env } from '../lib/env';
import { Gone, NotFound } from '../lib/errors';
import { sendMail } from '../lib/mailer';
import { hashPassword } from '../lib/passwords';
import { hashToken, newLinkToken } from '../lib/tokens';
import { PasswordReset } from '../entities/studio';
import { User } from '../entities/user';

export const RESET_TTL_MS = 60 * 60 * 1000;

/** Sends a reset link when the account exists; says nothing either way to the caller. */
export async function requestPasswordReset(email: string): Promise<void> {
  const ds = getDataSource();
  const user = await ds.getRepository(User).findOneBy({ email });
  if (!user) return;
  const { token, tokenHash } = newLinkToken();
  await ds.getRepository(PasswordReset).save(
    ds.getRepository(PasswordReset).create({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + RESET_TTL_MS) }),
  );
  await sendMail({
    to: user.email,
    subject: 'Reset your Lamella password',
    text:
      `Someone asked to reset the password for this e-mail on Lamella.\n\n` +
      `Open this link within an hour to choose a new password (usable once):\n${env().PUBLIC_URL}/reset/${token}\n\n` +
      `If it was not you, ignore this message; your password stays as it is.`,
  });
}

/** Sets the new password, uses up the link, and signs the account out everywhere else. */
export async function confirmPasswordReset(token: string, password: string): Promise<void> {
  await getDataSource().transaction(async (tx) => {
    const reset = await tx
      .getRepository(PasswordReset)
      .createQueryBuilder('r')
      .where('r.token_hash = :h', { h: hashToken(token) })
      .setLock('pessimistic_write')
      .getOne();
    if (!reset) throw new NotFound('This reset link is not valid.');
    if (reset.usedAt) throw new Gone('This reset link has already been used.');
    if (reset.expiresAt.getTime() <= Date.now()) throw new Gone('This reset link has expired. Ask for a new one.');
    await tx.getRepository(User).update({ id: reset.userId }, { passwordHash: await hashPassword(password) });
    await tx.getRepository(PasswordReset).update({ userId: reset.userId }, { usedAt: new Date() });
    await tx.query(`DELETE FROM session WHERE sess->'passport'->>'user' = $1`, [reset.userId]);
  });
}

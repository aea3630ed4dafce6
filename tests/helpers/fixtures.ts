import crypto from 'node:crypto';
import type { Role } from '../../shared/roles';

export const TEST_PASSWORD = 'fern-dew-morning-42';

export interface StudioFixture {
  studioId: string;
  users: Record<Role, { id: string; email: string; password: string }>;
}

/** A studio with one member per role; e-mails are unique per call so tests do not collide. */
export async function createStudioWithRoles(name = 'Fern Light Studio'): Promise<StudioFixture> {
  const { getDataSource } = await import('../../server/lib/data-source');
  const { hashPassword } = await import('../../server/lib/passwords');
  const { createStudio, addMember } = await import('../../server/services/membership-service');
  const { User } = await import('../../server/entities/user');
  const tag = crypto.randomBytes(4).toString('hex');
  const hash = await hashPassword(TEST_PASSWORD);
  const repo = getDataSource().getRepository(User);
  const users = {} as StudioFixture['users'];
  for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) {
    const email = `${role}-${tag}@studio.test`;
    const u = await repo.save(repo.create({ email, name: `Test ${role}`, passwordHash: hash }));
    users[role] = { id: u.id, email, password: TEST_PASSWORD };
  }
  const studio = await createStudio(`${name} ${tag}`, users.owner.id);
  for (const role of ['photographer', 'retoucher', 'guest'] as const) await addMember(studio.id, users[role].id, role);
  return { studioId: studio.id, users };
}

export async function caughtMailTo(email: string): Promise<{ subject: string; text: string }[]> {
  const { getDataSource } = await import('../../server/lib/data-source');
  for (let i = 0; i < 50; i++) {
    const rows: { subject: string; text_body: string }[] = await getDataSource().query(
      `SELECT subject, text_body FROM caught_mail WHERE $1 = ANY(to_addresses) ORDER BY received_at DESC`,
      [email.toLowerCase()],
    );
    if (rows.length) return rows.map((r) => ({ subject: r.subject, text: r.text_body }));
    await new Promise((r) => setTimeout(r, 100));
  }
  return [];
}

export function linkTokenFrom(text: string, kind: 'invite' | 'reset'): string {
  const m = new RegExp(`/${kind}/([A-Za-z0-9_-]+)`).exec(text);
  if (!m) throw new Error(`no ${kind} link in mail: ${text}`);
  return m[1];
}

// The demo studio a newcomer lands in: one member per role. Idempotent; --reset re-creates it.
import { getDataSource } from '../../server/lib/data-source';
import { hashPassword } from '../../server/lib/passwords';
import { addMember, createStudio } from '../../server/services/membership-service';
import { Studio } from '../../server/entities/studio';
import { User } from '../../server/entities/user';
import type { Role } from '../../shared/roles';
import { DEMO_STUDIO_NAME, DEMO_USERS } from './demo-users';
import { seedDemoKitAndPlans } from './demo-kit';
import { seedDemoSession } from './demo-session';

export async function demoExists(): Promise<boolean> {
  return (await getDataSource().getRepository(Studio).countBy({ name: DEMO_STUDIO_NAME })) > 0;
}

export async function resetDemo(): Promise<void> {
  const ds = getDataSource();
  await ds.getRepository(Studio).delete({ name: DEMO_STUDIO_NAME });
  for (const u of DEMO_USERS) await ds.getRepository(User).delete({ email: u.email });
}

/** Extra demo content (kit, plans, sessions) registers here so one seed call builds it all. */
export type DemoPart = (ctx: { studioId: string; users: Record<Role, string> }) => Promise<void>;
export const demoParts: DemoPart[] = [];
demoParts.push(seedDemoKitAndPlans);
demoParts.push(async (ctx) => void (await seedDemoSession(ctx)));

export async function seedDemo(opts: { reset?: boolean } = {}): Promise<'created' | 'present'> {
  if (opts.reset) await resetDemo();
  if (await demoExists()) return 'present';
  const repo = getDataSource().getRepository(User);
  const users = {} as Record<Role, string>;
  for (const u of DEMO_USERS) {
    const saved = await repo.save(repo.create({ email: u.email, name: u.name, passwordHash: await hashPassword(u.password) }));
    users[u.role] = saved.id;
  }
  const studio = await createStudio(DEMO_STUDIO_NAME, users.owner);
  for (const u of DEMO_USERS.filter((x) => x.role !== 'owner')) {
    await addMember(studio.id, users[u.role], u.role);
    await repo.update({ id: users[u.role] }, { lastStudioId: studio.id });
  }
  for (const part of demoParts) await part({ studioId: studio.id, users });
  return 'created';
}

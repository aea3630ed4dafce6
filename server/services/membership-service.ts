import { getDataSource } from '../lib/data-source';
import { Membership, Studio } from '../entities/studio';
import { User } from '../entities/user';
import type { Role } from '../../shared/roles';
import { Conflict, NotFound } from '../lib/errors';

export async function findMembership(studioId: string, userId: string): Promise<Membership | null> {
  return getDataSource().getRepository(Membership).findOneBy({ studioId, userId });
}

export interface StudioSummary {
  id: string;
  name: string;
  role: Role;
}

export async function studiosOf(userId: string): Promise<StudioSummary[]> {
  const rows = await getDataSource()
    .getRepository(Membership)
    .find({ where: { userId }, relations: { studio: true }, order: { createdAt: 'ASC' } });
  return rows.map((m) => ({ id: m.studioId, name: m.studio!.name, role: m.role }));
}

export interface MemberView {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  since: string;
}

export async function listMembers(studioId: string): Promise<MemberView[]> {
  const rows = await getDataSource()
    .getRepository(Membership)
    .find({ where: { studioId }, relations: { user: true }, order: { createdAt: 'ASC' } });
  return rows.map((m) => ({
    id: m.id,
    userId: m.userId,
    name: m.user!.name,
    email: m.user!.email,
    role: m.role,
    since: m.createdAt.toISOString(),
  }));
}

/** Changes a role or removes a member, refusing to leave the studio without an owner. */
export async function updateMember(studioId: string, membershipId: string, change: { role: Role } | 'remove') {
  await getDataSource().transaction(async (tx) => {
    const repo = tx.getRepository(Membership);
    // Lock the studio's memberships so two owners demoting each other cannot both succeed.
    const members = await repo
      .createQueryBuilder('m')
      .where('m.studio_id = :studioId', { studioId })
      .setLock('pessimistic_write')
      .getMany();
    const target = members.find((m) => m.id === membershipId);
    if (!target) throw new NotFound('No such member in this studio.');
    const owners = members.filter((m) => m.role === 'owner');
    const losesOwner = target.role === 'owner' && (change === 'remove' || change.role !== 'owner');
    if (losesOwner && owners.length === 1) {
      throw new Conflict('A studio needs at least one owner. Make someone else owner first.');
    }
    if (change === 'remove') await repo.delete({ id: target.id });
    else await repo.update({ id: target.id }, { role: change.role });
  });
}

export async function createStudio(name: string, ownerId: string): Promise<Studio> {
  return getDataSource().transaction(async (tx) => {
    const studio = await tx.getRepository(Studio).save(tx.getRepository(Studio).create({ name }));
    await tx.getRepository(Membership).save(tx.getRepository(Membership).create({ studioId: studio.id, userId: ownerId, role: 'owner' }));
    await tx.getRepository(User).update({ id: ownerId }, { lastStudioId: studio.id });
    return studio;
  });
}

export async function addMember(studioId: string, userId: string, role: Role): Promise<void> {
  await getDataSource()
    .createQueryBuilder()
    .insert()
    .into(Membership)
    .values({ studioId, userId, role })
    .orIgnore()
    .execute();
}

// Who may see a stack: owners, photographers and guests of its studio see every stack; a retoucher
// member sees only the stacks handed to them (from hand-off on). Always checked on the server.
import { getDataSource } from '../lib/data-source';
import { Forbidden, NotFound } from '../lib/errors';
import { ShootSession, Stack } from '../entities/session';
import type { Role } from '../../shared/roles';

export interface StackInStudio {
  stack: Stack;
  session: ShootSession;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function stackInStudio(studioId: string, stackId: string): Promise<StackInStudio> {
  const stack = UUID.test(stackId) ? await getDataSource().getRepository(Stack).findOneBy({ id: stackId }) : null;
  const session = stack ? await getDataSource().getRepository(ShootSession).findOneBy({ id: stack.sessionId, studioId }) : null;
  if (!stack || !session) throw new NotFound('No such stack in this studio.');
  return { stack, session };
}

export async function stackForMember(member: { studioId: string; role: Role }, userId: string, stackId: string): Promise<StackInStudio> {
  const found = await stackInStudio(member.studioId, stackId);
  if (member.role === 'retoucher') {
    const handedToMe = found.stack.handedToUserId === userId && ['handed-off', 'merged', 'archived'].includes(found.stack.state);
    if (!handedToMe) throw new Forbidden('This stack has not been handed to you.');
  }
  return found;
}

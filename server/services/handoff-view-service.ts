// What the hand-off panel, the retoucher's list and the share page show.
import { getDataSource } from '../lib/data-source';
import { User } from '../entities/user';
import type { Stack } from '../entities/session';
import type { Role } from '../../shared/roles';
import { CAN_EDIT_WORK } from '../../shared/roles';
import type { HandedTo, HandoffView, MyHandoffRow, SharePageView, StackEventView } from '../../shared/schemas/handoff';
import { stackForMember } from './stack-access';
import { linksOfStack, type OpenedLink } from './share-link-service';
import { latestMergedResult, mergedResultView } from './merged-result-service';
import { bundleStateOf, contactSheetReady } from './handoff-bundle';

async function includedFrameCount(stackId: string): Promise<number> {
  const [row]: { n: number }[] = await getDataSource().query(`SELECT count(*)::int AS n FROM frames WHERE stack_id = $1 AND NOT excluded`, [stackId]);
  return row.n;
}

async function handedTo(stack: Stack): Promise<HandedTo | null> {
  if (stack.handedToUserId) {
    const u = await getDataSource().getRepository(User).findOneBy({ id: stack.handedToUserId });
    return { kind: 'member', userId: stack.handedToUserId, name: u?.name || u?.email || 'a former member', email: u?.email ?? '' };
  }
  if (stack.handedToEmail) return { kind: 'email', userId: null, name: stack.handedToEmail, email: stack.handedToEmail };
  return null;
}

export async function stackEventViews(stackId: string): Promise<StackEventView[]> {
  const rows: { action: string; actor_label: string; detail: Record<string, unknown>; at: Date }[] = await getDataSource().query(
    `SELECT action, actor_label, detail, at FROM stack_events WHERE stack_id = $1 ORDER BY at DESC, id`,
    [stackId],
  );
  return rows.map((r) => ({ action: r.action, actor: r.actor_label, detail: r.detail, at: new Date(r.at).toISOString() }));
}

async function studioRetouchers(studioId: string) {
  const rows: { user_id: string; name: string; email: string }[] = await getDataSource().query(
    `SELECT u.id AS user_id, u.name, u.email FROM memberships m JOIN users u ON u.id = m.user_id
      WHERE m.studio_id = $1 AND m.role = 'retoucher' ORDER BY lower(u.name), u.email`,
    [studioId],
  );
  return rows.map((r) => ({ userId: r.user_id, name: r.name, email: r.email }));
}

/** The hand-off panel of one stack; a retoucher sees it only for a stack handed to them. */
export async function handoffView(member: { studioId: string; role: Role }, userId: string, stackId: string): Promise<HandoffView> {
  const { stack, session } = await stackForMember(member, userId, stackId);
  const editor = CAN_EDIT_WORK.includes(member.role);
  const mine = member.role === 'retoucher' && stack.handedToUserId === userId;
  const merged = await latestMergedResult(stack.id);
  return {
    stack: {
      id: stack.id,
      sessionId: session.id,
      sessionTitle: session.title,
      name: stack.name,
      state: stack.state,
      version: stack.version,
      frameCount: await includedFrameCount(stack.id),
      handedTo: await handedTo(stack),
      handedOffAt: stack.handedOffAt?.toISOString() ?? null,
      mergedAt: stack.mergedAt?.toISOString() ?? null,
    },
    can: {
      handOff: editor && stack.state === 'ready',
      takeBack: editor && stack.state === 'handed-off',
      archive: editor && stack.state === 'merged',
      uploadMerged: stack.state === 'handed-off' && (editor || mine),
      manageLinks: editor && stack.state === 'handed-off' && stack.handedToEmail !== null,
    },
    retouchers: editor ? await studioRetouchers(member.studioId) : [],
    shareLinks: editor ? await linksOfStack(stack.id) : [],
    mergedResult: merged ? mergedResultView(merged) : null,
    events: await stackEventViews(stack.id),
  };
}

/** The stacks handed to this person in this studio that are still theirs to work on or just done. */
export async function myHandoffs(studioId: string, userId: string): Promise<MyHandoffRow[]> {
  const ds = getDataSource();
  const rows: { id: string }[] = await ds.query(
    `SELECT s.id FROM stacks s JOIN shoot_sessions ss ON ss.id = s.session_id
      WHERE ss.studio_id = $1 AND s.handed_to_user_id = $2 AND s.state IN ('handed-off', 'merged')
      ORDER BY (s.state = 'handed-off') DESC, s.handed_off_at DESC NULLS LAST`,
    [studioId, userId],
  );
  const out: MyHandoffRow[] = [];
  for (const { id } of rows) {
    const { stack, session } = await stackForMember({ studioId, role: 'retoucher' }, userId, id);
    const [by]: { actor_label: string }[] = await ds.query(
      `SELECT actor_label FROM stack_events WHERE stack_id = $1 AND action = 'handed-off' ORDER BY at DESC LIMIT 1`,
      [id],
    );
    const merged = await latestMergedResult(stack.id);
    const bundle = await bundleStateOf(stack);
    out.push({
      stackId: stack.id,
      stackName: stack.name,
      state: stack.state,
      version: stack.version,
      sessionId: session.id,
      sessionTitle: session.title,
      shootDate: session.shootDate,
      frameCount: await includedFrameCount(stack.id),
      handedOffAt: stack.handedOffAt?.toISOString() ?? null,
      handedOffBy: by?.actor_label ?? '',
      mergedAt: stack.mergedAt?.toISOString() ?? null,
      contactSheetAvailable: await contactSheetReady(stack),
      bundle: { status: bundle.status, sizeBytes: bundle.sizeBytes },
      mergedResult: merged ? mergedResultView(merged) : null,
    });
  }
  return out;
}

export async function sharePageView({ link, stack, session, studio }: OpenedLink): Promise<SharePageView> {
  const bundle = await bundleStateOf(stack);
  const merged = await latestMergedResult(stack.id);
  return {
    stackName: stack.name,
    studioName: studio.name,
    sessionTitle: session.title,
    shootDate: session.shootDate,
    state: stack.state,
    frameCount: await includedFrameCount(stack.id),
    email: link.email,
    expiresAt: link.expiresAt.toISOString(),
    downloadCount: link.downloadCount,
    contactSheetAvailable: await contactSheetReady(stack),
    bundle: { status: bundle.status, sizeBytes: bundle.sizeBytes },
    mergedResult: merged ? { originalName: merged.originalName, sizeBytes: merged.sizeBytes, uploadedAt: merged.createdAt.toISOString() } : null,
    canUploadMerged: stack.state === 'handed-off',
  };
}

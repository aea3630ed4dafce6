// Bundles: asking for one (idempotent per stack version, or per set of stack versions for a
// session), reading their state with the stale flag worked out on read, who may see and download
// them, and opening a finished one for download (also used by share links).
import type { Readable } from 'node:stream';
import { In } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { BadInput, Conflict, Forbidden, NotFound } from '../lib/errors';
import { enqueue } from '../lib/queues';
import { getStore } from '../lib/storage';
import { Bundle } from '../entities/bundle';
import { Frame, ShootSession, Stack } from '../entities/session';
import { SESSION_BUNDLE_STATES, type BundleView } from '../../shared/schemas/bundles';
import { safeStackFolderName } from '../../shared/bundle-names';
import type { Role } from '../../shared/roles';
import { sessionInStudio } from './session-service';
import { stackForMember } from './stack-access';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

async function currentVersions(stackIds: string[]): Promise<Map<string, number>> {
  if (stackIds.length === 0) return new Map();
  const stacks = await getDataSource().getRepository(Stack).find({ where: { id: In(stackIds) }, select: { id: true, version: true } });
  return new Map(stacks.map((s) => [s.id, s.version]));
}

function toView(b: Bundle, versions: Map<string, number>): BundleView {
  const stale = Object.entries(b.stackVersions).some(([stackId, version]) => versions.get(stackId) !== version);
  return {
    id: b.id,
    kind: b.kind,
    status: b.status,
    progress: b.progress,
    error: b.error,
    sessionId: b.sessionId,
    stackId: b.stackId,
    stackVersion: b.stackVersion,
    stackVersions: b.stackVersions,
    stale,
    fileName: `${b.fileName}.zip`,
    bytes: b.bytes,
    createdAt: b.createdAt.toISOString(),
    finishedAt: b.finishedAt?.toISOString() ?? null,
  };
}

export async function bundleView(b: Bundle): Promise<BundleView> {
  const view = toView(b, await currentVersions(Object.keys(b.stackVersions)));
  if (b.kind === 'session' && !view.stale) {
    // A stack marked ready since is missing from the bundle: that makes it stale too.
    const now = await getDataSource().getRepository(Stack).find({ where: { sessionId: b.sessionId, state: In([...SESSION_BUNDLE_STATES]) }, select: { id: true } });
    view.stale = now.some((s) => !(s.id in b.stackVersions));
  }
  return view;
}

async function includedFrameCount(stackIds: string[]): Promise<number> {
  if (stackIds.length === 0) return 0;
  return getDataSource().getRepository(Frame).count({ where: { stackId: In(stackIds), excluded: false } });
}

async function enqueueBundle(b: Bundle) {
  if (b.status === 'queued') await enqueue('bundle', { bundleId: b.id }, `bundle:${b.id}`);
}

/**
 * The bundle of the stack's current version: the live one if it was asked for already (queued,
 * being made or done), else a new one. A failed bundle is not reused: asking again makes a new one.
 */
export async function requestStackBundle(stackId: string, actorUserId: string | null): Promise<{ bundle: BundleView; created: boolean }> {
  const ds = getDataSource();
  const stack = UUID.test(stackId) ? await ds.getRepository(Stack).findOneBy({ id: stackId }) : null;
  if (!stack) throw new NotFound('No such stack.');
  const session = await ds.getRepository(ShootSession).findOneByOrFail({ id: stack.sessionId });
  if ((await includedFrameCount([stack.id])) === 0) {
    throw new BadInput(`Every frame of “${stack.name}” is excluded (or it has none): there is nothing to bundle.`);
  }
  const inserted: { id: string }[] = await ds.query(
    `INSERT INTO bundles (studio_id, stack_id, session_id, stack_version, stack_versions, kind, file_name, created_by)
     VALUES ($1, $2, $3, $4, $5, 'stack', $6, $7)
     ON CONFLICT (stack_id, stack_version) WHERE kind = 'stack' AND status <> 'failed' DO NOTHING RETURNING id`,
    [session.studioId, stack.id, session.id, stack.version, JSON.stringify({ [stack.id]: stack.version }), safeStackFolderName(stack.name), actorUserId],
  );
  const bundle = inserted.length
    ? await ds.getRepository(Bundle).findOneByOrFail({ id: inserted[0].id })
    : await ds.getRepository(Bundle).findOneOrFail({ where: { stackId: stack.id, stackVersion: stack.version, kind: 'stack', status: In(['queued', 'running', 'done']) } });
  await enqueueBundle(bundle);
  return { bundle: await bundleView(bundle), created: inserted.length > 0 };
}

/** One zip of the session with a folder per stack, holding every stack past draft. */
export async function requestSessionBundle(studioId: string, sessionId: string, actorUserId: string | null): Promise<{ bundle: BundleView; created: boolean }> {
  const ds = getDataSource();
  const session = await sessionInStudio(studioId, sessionId);
  const stacks = await ds.getRepository(Stack).find({ where: { sessionId, state: In([...SESSION_BUNDLE_STATES]) }, order: { position: 'ASC' } });
  if (stacks.length === 0 || (await includedFrameCount(stacks.map((s) => s.id))) === 0) {
    throw new BadInput('No stack of this session is past draft (with frames left in it): mark the stacks you have checked ready, then bundle the session.');
  }
  const versions = Object.fromEntries(stacks.map((s) => [s.id, s.version]));
  const result = await ds.transaction(async (tx) => {
    // Serialises requests for one session so the same set of versions is bundled once.
    await tx.query(`SELECT pg_advisory_xact_lock(hashtext($1))`, [`session-bundle:${sessionId}`]);
    const live = await tx.getRepository(Bundle).createQueryBuilder('b')
      .where(`b.session_id = :sessionId AND b.kind = 'session' AND b.status <> 'failed' AND b.stack_versions = CAST(:versions AS jsonb)`, { sessionId, versions: JSON.stringify(versions) })
      .orderBy('b.created_at', 'DESC').getOne();
    const repo = tx.getRepository(Bundle);
    const bundle = live ?? (await repo.save(repo.create({
      studioId, sessionId, stackId: null, stackVersion: null, stackVersions: versions, kind: 'session', status: 'queued', progress: 0,
      fileName: safeStackFolderName(session.title, 'session'), createdBy: actorUserId,
    })));
    return { bundle, created: !live };
  });
  // Only after the commit: a worker that takes the job at once must find the bundle's row.
  await enqueueBundle(result.bundle);
  return { bundle: toView(result.bundle, new Map(stacks.map((s) => [s.id, s.version]))), created: result.created };
}

export async function latestStackBundle(stackId: string): Promise<BundleView | null> {
  const b = await getDataSource().getRepository(Bundle).findOne({ where: { stackId, kind: 'stack' }, order: { createdAt: 'DESC' } });
  return b ? bundleView(b) : null;
}

export async function latestSessionBundle(studioId: string, sessionId: string): Promise<BundleView | null> {
  await sessionInStudio(studioId, sessionId);
  const b = await getDataSource().getRepository(Bundle).findOne({ where: { sessionId, kind: 'session' }, order: { createdAt: 'DESC' } });
  return b ? bundleView(b) : null;
}

/**
 * A bundle of this studio the member may see: a retoucher only the bundles of stacks handed to
 * them (never a session bundle, which holds stacks of others).
 */
export async function bundleForMember(member: { studioId: string; role: Role }, userId: string, bundleId: string): Promise<Bundle> {
  const b = UUID.test(bundleId) ? await getDataSource().getRepository(Bundle).findOneBy({ id: bundleId, studioId: member.studioId }) : null;
  if (!b) throw new NotFound('No such bundle in this studio.');
  if (member.role === 'retoucher') {
    if (b.kind !== 'stack' || !b.stackId) throw new Forbidden('Session bundles are for the studio’s photographers; you can download the stacks handed to you.');
    await stackForMember(member, userId, b.stackId);
  }
  return b;
}

export interface BundleDownload {
  stream: Readable;
  sizeBytes: number;
  fileName: string;
}

/** A finished bundle's zip, for a download route (members, or a share link checked elsewhere). */
export async function openBundleForDownload(bundleId: string): Promise<BundleDownload> {
  const b = UUID.test(bundleId) ? await getDataSource().getRepository(Bundle).findOneBy({ id: bundleId }) : null;
  if (!b) throw new NotFound('No such bundle.');
  if (b.status !== 'done' || !b.storageKey || b.bytes === null) {
    throw new Conflict(b.status === 'failed' ? `This bundle failed: ${b.error ?? 'unknown error'}` : `This bundle is not finished yet (${b.progress} %).`);
  }
  if (!(await getStore().exists(b.storageKey))) throw new NotFound('The bundle’s file is no longer stored; make a new bundle.');
  return { stream: getStore().createReadStream(b.storageKey), sizeBytes: b.bytes, fileName: `${b.fileName}.zip` };
}

/** `attachment` with an ASCII fallback name and the exact UTF-8 name (RFC 6266, RFC 5987). */
export function attachmentDisposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]|["\\]/g, '_');
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}

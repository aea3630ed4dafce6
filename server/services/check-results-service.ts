// Stack checks after the worker: running them on a loaded input, storing the latest run, the stack
// page's view with its status, the frame marks other pages draw, queueing runs when stacks or
// their frames change, and the studio's thresholds.
import type { EntityManager } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { NotFound } from '../lib/errors';
import { logger } from '../lib/logger';
import { enqueueMany, queueFor } from '../lib/queues';
import { Frame } from '../entities/session';
import { StackCheckRun, StudioCheckThresholds } from '../entities/stack-checks';
import { runStackChecks } from '../../shared/checks';
import { codesByFrameId, exposureStrip, focusMapOf, numberChecks } from '../../shared/check-pictures';
import { checkThresholdsInputSchema, checkThresholdsSchema, type CheckCode, type CheckThresholds } from '../../shared/schemas/checks';
import type { CheckThresholdsView, StackCheckResults, StackChecksView } from '../../shared/schemas/check-views';
import { loadCheckStates, studioThresholds, type StackCheckState } from './check-input';
import type { StackInStudio } from './stack-access';

/** The checks and the numbers behind the pictures, for one loaded input. */
export function computeCheckResults(state: StackCheckState): StackCheckResults {
  const checks = runStackChecks({ frames: state.frames, plan: state.plan, thresholds: state.thresholds });
  return {
    checks: numberChecks(checks, state.frames),
    frames: exposureStrip(state.frames),
    excludedFrames: state.excludedFrames,
    focusMap: focusMapOf(state.frames, state.thresholds),
  };
}

/** Stores a run unless the stored one already matches this input. */
export async function storeCheckRun(manager: EntityManager, state: StackCheckState): Promise<'stored' | 'current'> {
  const repo = manager.getRepository(StackCheckRun);
  const existing = await repo.findOne({ where: { stackId: state.stack.id }, select: { stackId: true, inputKey: true } });
  if (existing?.inputKey === state.inputKey) return 'current';
  const results = computeCheckResults(state);
  await repo.upsert(
    { stackId: state.stack.id, stackVersion: state.stack.version, inputKey: state.inputKey, thresholds: state.thresholds, results, computedAt: new Date() },
    ['stackId'],
  );
  return 'stored';
}

const checkJobId = (stackId: string, key: string) => `checks_${stackId}_${key}`;

/** Queues a run for each given stack that is measured and not current; repeats are free. */
async function queueRuns(states: StackCheckState[], manager: EntityManager) {
  const ready = states.filter((s) => s.pendingPreviews === 0);
  if (ready.length === 0) return 0;
  const stored = await manager.getRepository(StackCheckRun).find({ select: { stackId: true, inputKey: true }, where: ready.map((s) => ({ stackId: s.stack.id })) });
  const keyOf = new Map(stored.map((r) => [r.stackId, r.inputKey]));
  const due = ready.filter((s) => keyOf.get(s.stack.id) !== s.inputKey);
  // A stack can come back to an input it had before (undo, a plan edited back): BullMQ ignores a
  // job whose id it still keeps, so a finished run of that input is cleared first.
  for (const s of due) {
    const old = await queueFor('stackChecks').getJob(checkJobId(s.stack.id, s.inputKey));
    if (old && ((await old.isCompleted()) || (await old.isFailed()))) await old.remove();
  }
  await enqueueMany('stackChecks', due.map((s) => ({ payload: { stackId: s.stack.id, version: s.stack.version }, jobId: checkJobId(s.stack.id, s.inputKey) })));
  return due.length;
}

/** After any change to a session's stacks (grouping, hand edits, undo): checks every stack again where needed. */
export async function queueChecksForSession(sessionId: string): Promise<number> {
  const manager = getDataSource().manager;
  return queueRuns(await loadCheckStates(manager, { sessionId }), manager);
}

/**
 * For the sorting services, after their transaction: a change is already saved, so a failure to
 * queue is logged rather than reported (the stack page queues missing checks when it is opened).
 */
export async function queueChecksAfterChange(sessionId: string): Promise<void> {
  await queueChecksForSession(sessionId).catch((err: unknown) => logger.warn({ sessionId, err }, 'could not queue the stack checks'));
}

/** After a frame's preview and statistics are made (or failed for good): checks its stack once all are in. */
export async function queueChecksForFrame(frameId: string): Promise<number> {
  const manager = getDataSource().manager;
  const frame = await manager.getRepository(Frame).findOne({ where: { id: frameId }, select: { id: true, stackId: true } });
  if (!frame?.stackId) return 0;
  // Cheap test first: most frames finish while others of their stack are still pending.
  const pending = await manager.getRepository(Frame).count({ where: { stackId: frame.stackId, excluded: false, previewStatus: 'pending' } });
  if (pending > 0) return 0;
  return queueRuns(await loadCheckStates(manager, { stackId: frame.stackId }), manager);
}

/** frameId → check codes of the stack's current checks (excluded frames have none). */
export async function storedCheckCodesByFrame(stackId: string, manager: EntityManager = getDataSource().manager): Promise<Map<string, CheckCode[]>> {
  const [state] = await loadCheckStates(manager, { stackId });
  if (!state) return new Map();
  const row = await manager.getRepository(StackCheckRun).findOneBy({ stackId });
  if (row?.inputKey === state.inputKey) return codesByFrameId(row.results.checks);
  // Not run for this input yet: with every frame measured the checks are computed here (they are
  // quick); with frames still unmeasured the neighbours of a missing frame would look like a
  // focus gap, so no marks are given until they are.
  if (state.pendingPreviews > 0) return new Map();
  return codesByFrameId(computeCheckResults(state).checks);
}

/**
 * frameId → check codes for every stack of a session, from the stored runs that are current (for
 * the sorting page: stacks not checked yet for their present arrangement show no marks).
 */
export async function storedCheckCodesForSession(sessionId: string, manager: EntityManager = getDataSource().manager): Promise<Map<string, CheckCode[]>> {
  const states = await loadCheckStates(manager, { sessionId });
  if (states.length === 0) return new Map();
  const rows = await manager.getRepository(StackCheckRun).find({ where: states.map((s) => ({ stackId: s.stack.id })) });
  const current = rows.filter((r) => states.some((s) => s.stack.id === r.stackId && s.inputKey === r.inputKey));
  return codesByFrameId(current.flatMap((r) => r.results.checks));
}

export async function stackChecksView({ stack }: StackInStudio): Promise<StackChecksView> {
  const manager = getDataSource().manager;
  const [state] = await loadCheckStates(manager, { stackId: stack.id });
  if (!state) throw new NotFound('No such stack in this studio.');
  const row = await manager.getRepository(StackCheckRun).findOneBy({ stackId: stack.id });
  let status: StackChecksView['status'] = 'current';
  if (row?.inputKey !== state.inputKey) {
    status = state.pendingPreviews > 0 ? 'waiting-for-previews' : 'updating';
    // Normally queued already by the change itself; queueing again here heals a lost job.
    if (status === 'updating') await queueRuns([state], manager);
  }
  return {
    stackId: stack.id,
    stackVersion: state.stack.version,
    status,
    previews: { total: state.frames.length, pending: state.pendingPreviews },
    results: row?.results ?? null,
    resultsStackVersion: row?.stackVersion ?? null,
    computedAt: row?.computedAt.toISOString() ?? null,
    thresholds: row?.thresholds ?? state.thresholds,
  };
}

/** The limits the body named, as parsed (the schema fills in defaults for the others). */
export function ownLimits(body: unknown, parsed: Partial<CheckThresholds>): Partial<CheckThresholds> {
  const named = new Set(Object.keys(body as object));
  return Object.fromEntries(Object.entries(parsed).filter(([key]) => named.has(key)));
}

export async function checkThresholdsView(studioId: string): Promise<CheckThresholdsView> {
  const { thresholds, custom, updatedAt } = await studioThresholds(getDataSource().manager, studioId);
  return { thresholds, custom, defaults: checkThresholdsSchema.parse({}), updatedAt: updatedAt?.toISOString() ?? null };
}

/**
 * Replaces the studio's own limits (fields left out go back to the defaults) and checks every
 * stack of the studio again with them. A ZodError (422 with field paths) for a bad limit.
 */
export async function saveCheckThresholds(studioId: string, body: unknown, userId: string): Promise<CheckThresholdsView> {
  const custom = ownLimits(body, checkThresholdsInputSchema.parse(body));
  const ds = getDataSource();
  const updatedAt = new Date();
  await ds.getRepository(StudioCheckThresholds).upsert({ studioId, thresholds: custom, updatedBy: userId, updatedAt }, ['studioId']);
  const stacks: { id: string; version: number }[] = await ds.query(
    `SELECT s.id, s.version FROM stacks s JOIN shoot_sessions ss ON ss.id = s.session_id WHERE ss.studio_id = $1`,
    [studioId],
  );
  // One job per stack for this change; the job loads the stack itself and skips it if current.
  await enqueueMany('stackChecks', stacks.map((s) => ({ payload: { stackId: s.id, version: s.version }, jobId: `checks_${s.id}_limits${updatedAt.getTime()}` })));
  return checkThresholdsView(studioId);
}


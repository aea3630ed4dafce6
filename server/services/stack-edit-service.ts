// Hand edits on a session's stacks. Each runs in one transaction under the session's sorting lock,
// records the arrangement before it for undo, bumps the version of every stack it touches, leaves
// an audit row, and answers with the new sorting view. Frames are moved, never deleted; a stack
// left without frames is removed (undo brings it back).
import type { EntityManager } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { Conflict, NotFound } from '../lib/errors';
import { Frame, Stack } from '../entities/session';
import { Plan } from '../entities/plan';
import type { StackPatch } from '../../shared/schemas/stack-edits';
import { lockSession, takeSnapshot } from './sorting-service';
import { sortingView } from './sorting-view-service';
import { sessionInStudio } from './session-service';
import { queueChecksAfterChange } from './check-results-service';
import {
  assertEditable, bumpVersions, fieldError, framesByIds, framesOfStack, mergeByCaptureTime, nextFreeName,
  placeFrames, plural, recordEvent, renumberStacks, stackIn, stacksOf, type Actor,
} from './stack-edit-steps';

export type { Actor } from './stack-edit-steps';

interface EditContext {
  tx: EntityManager;
  sessionId: string;
  stacks: Stack[];
  /** Records the undo step; call after validating, before the first change. */
  snapshot: (label: string) => Promise<void>;
}

/** Runs one edit; `edit` returns false when nothing needed to change (then no undo step is kept). */
async function editSorting(studioId: string, sessionId: string, actor: Actor, edit: (ctx: EditContext) => Promise<boolean | void>) {
  await sessionInStudio(studioId, sessionId);
  await getDataSource().transaction(async (tx) => {
    await lockSession(tx, sessionId);
    const stacks = await stacksOf(tx, sessionId);
    await edit({ tx, sessionId, stacks, snapshot: (label) => takeSnapshot(tx, sessionId, label, actor.userId) });
  });
  await queueChecksAfterChange(sessionId);
  return sortingView(studioId, sessionId);
}

/** Frames from `frameId` on become a new stack right after this one. */
export function splitStack(studioId: string, sessionId: string, stackId: string, frameId: string, actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const stack = stackIn(stacks, stackId);
    assertEditable(stack);
    const frames = await framesOfStack(tx, stack.id);
    const at = frames.findIndex((f) => f.id === frameId);
    if (at < 0) throw fieldError('frameId', `That frame is not in stack “${stack.name}”.`);
    if (at === 0) throw fieldError('frameId', `That is the first frame of “${stack.name}”: splitting there would leave nothing before it. Split at a later frame.`);
    await snapshot(`split ${stack.name}`);
    await tx.query(`UPDATE stacks SET position = position + 1 WHERE session_id = $1 AND position > $2`, [sessionId, stack.position]);
    const name = nextFreeName(stack.name, new Set(stacks.map((s) => s.name.toLowerCase())));
    const repo = tx.getRepository(Stack);
    const created = await repo.save(repo.create({ sessionId, name, state: stack.state, position: stack.position + 1, startReason: 'split', planId: null, version: 1 }));
    const moved = frames.slice(at).map((f) => f.id);
    await placeFrames(tx, created.id, moved);
    await bumpVersions(tx, [stack.id]);
    await recordEvent(tx, stack.id, actor, 'split', { atFrameId: frameId, newStackId: created.id, newStackName: name, framesMoved: moved.length });
    await recordEvent(tx, created.id, actor, 'created-by-split', { fromStackId: stack.id, fromStackName: stack.name, frames: moved.length });
  });
}

/** The next stack's frames join the end of this one; the next stack is removed. */
export function mergeWithNext(studioId: string, sessionId: string, stackId: string, actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const stack = stackIn(stacks, stackId);
    assertEditable(stack);
    const next = stacks[stacks.indexOf(stack) + 1];
    if (!next) throw fieldError('stackId', `“${stack.name}” is the last stack: there is no next stack to merge it with.`);
    assertEditable(next);
    await snapshot(`merge ${stack.name} with ${next.name}`);
    const own = await framesOfStack(tx, stack.id);
    const added = await framesOfStack(tx, next.id);
    await placeFrames(tx, stack.id, [...own, ...added].map((f) => f.id));
    // Checked only if both halves were checked; a plan link survives from either side.
    await tx.getRepository(Stack).update({ id: stack.id }, {
      state: stack.state === 'ready' && next.state === 'ready' ? 'ready' : 'draft',
      planId: stack.planId ?? next.planId,
    });
    await tx.getRepository(Stack).delete({ id: next.id });
    await renumberStacks(tx, sessionId);
    await bumpVersions(tx, [stack.id]);
    await recordEvent(tx, stack.id, actor, 'merged', { absorbedStackId: next.id, absorbedStackName: next.name, framesAdded: added.length });
  });
}

/** Moves frames to a stack (by capture time into its order) or, with null, to the loose frames. */
export function moveFrames(studioId: string, sessionId: string, frameIds: string[], toStackId: string | null, actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const target = toStackId === null ? null : stackIn(stacks, toStackId);
    if (target) assertEditable(target);
    const frames = (await framesByIds(tx, sessionId, frameIds)).filter((f) => f.stackId !== toStackId);
    if (frames.length === 0) throw fieldError('frameIds', target ? `The selected frames are already in “${target.name}”.` : 'The selected frames are already loose.');
    const sources = [...new Set(frames.map((f) => f.stackId).filter((id): id is string => id !== null))].map((id) => stackIn(stacks, id));
    sources.forEach(assertEditable);
    await snapshot(`move ${plural(frames.length, 'frame')} to ${target ? target.name : 'loose frames'}`);
    const movedIds = new Set(frames.map((f) => f.id));
    if (target) await placeFrames(tx, target.id, mergeByCaptureTime(await framesOfStack(tx, target.id), frames).map((f) => f.id));
    else await placeFrames(tx, null, [...movedIds]);
    const emptied: string[] = [];
    for (const source of sources) {
      const left = (await framesOfStack(tx, source.id)).filter((f) => !movedIds.has(f.id));
      if (left.length === 0) {
        emptied.push(source.name);
        await tx.getRepository(Stack).delete({ id: source.id });
        continue;
      }
      await placeFrames(tx, source.id, left.map((f) => f.id));
      await bumpVersions(tx, [source.id]);
      await recordEvent(tx, source.id, actor, 'frames-moved-out', { frameIds: frames.filter((f) => f.stackId === source.id).map((f) => f.id), toStackId });
    }
    if (emptied.length) await renumberStacks(tx, sessionId);
    if (target) {
      await bumpVersions(tx, [target.id]);
      await recordEvent(tx, target.id, actor, 'frames-moved-in', { frameIds: [...movedIds], fromStackIds: sources.map((s) => s.id), emptiedStacks: emptied });
    }
  });
}

/** Excluded frames stay in their stack, marked, and are left out of bundles; nothing is deleted. */
export function setFramesExcluded(studioId: string, sessionId: string, frameIds: string[], excluded: boolean, actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const frames = (await framesByIds(tx, sessionId, frameIds)).filter((f) => f.excluded !== excluded);
    if (frames.length === 0) return false;
    const touched = [...new Set(frames.map((f) => f.stackId).filter((id): id is string => id !== null))].map((id) => stackIn(stacks, id));
    touched.forEach(assertEditable);
    await snapshot(`${excluded ? 'exclude' : 'include'} ${plural(frames.length, 'frame')}`);
    await tx.getRepository(Frame).update(frames.map((f) => f.id), { excluded });
    await bumpVersions(tx, touched.map((s) => s.id));
    for (const s of touched) {
      await recordEvent(tx, s.id, actor, excluded ? 'frames-excluded' : 'frames-included', { frameIds: frames.filter((f) => f.stackId === s.id).map((f) => f.id) });
    }
    return true;
  });
}

/** Renames a stack and/or links it to a plan of the same studio (null unlinks). */
export function patchStack(studioId: string, sessionId: string, stackId: string, patch: StackPatch, actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const stack = stackIn(stacks, stackId);
    assertEditable(stack);
    const rename = patch.name !== undefined && patch.name !== stack.name;
    const relink = patch.planId !== undefined && patch.planId !== stack.planId;
    if (rename && stacks.some((s) => s.id !== stack.id && s.name.toLowerCase() === patch.name!.toLowerCase())) {
      throw new Conflict(`Another stack in this session is already called “${patch.name}”. Pick another name.`);
    }
    let plan: Plan | null = null;
    if (relink && patch.planId) {
      plan = await tx.getRepository(Plan).findOneBy({ id: patch.planId, studioId });
      if (!plan) throw new NotFound('No such plan in this studio.');
    }
    if (!rename && !relink) return false;
    await snapshot(rename ? `rename ${stack.name}` : plan ? `link plan to ${stack.name}` : `unlink plan from ${stack.name}`);
    await tx.getRepository(Stack).update({ id: stack.id }, { ...(rename ? { name: patch.name } : {}), ...(relink ? { planId: patch.planId } : {}) });
    await bumpVersions(tx, [stack.id]);
    if (rename) await recordEvent(tx, stack.id, actor, 'renamed', { from: stack.name, to: patch.name });
    if (relink) {
      await recordEvent(tx, stack.id, actor, plan ? 'plan-linked' : 'plan-unlinked', plan ? { planId: plan.id, planName: plan.name } : { planId: stack.planId });
    }
    return true;
  });
}

/** A new frame order for one stack: every frame of the stack, each once. */
export function reorderFrames(studioId: string, sessionId: string, stackId: string, frameIds: string[], actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const stack = stackIn(stacks, stackId);
    assertEditable(stack);
    const current = await framesOfStack(tx, stack.id);
    const have = new Set(current.map((f) => f.id));
    const unique = new Set(frameIds);
    if (unique.size !== frameIds.length || frameIds.length !== current.length || !frameIds.every((id) => have.has(id))) {
      throw fieldError('frameIds', `Send every frame of “${stack.name}” exactly once: it has ${plural(current.length, 'frame')}, the new order names ${plural(unique.size, 'distinct frame')}.`);
    }
    if (frameIds.every((id, i) => current[i].id === id)) return false;
    await snapshot(`reorder ${stack.name}`);
    await placeFrames(tx, stack.id, frameIds);
    await bumpVersions(tx, [stack.id]);
    await recordEvent(tx, stack.id, actor, 'reordered', { frameIds });
    return true;
  });
}

/** draft → ready once a person has checked the stack; ready → draft to work on it again. */
export function setStackState(studioId: string, sessionId: string, stackId: string, state: 'draft' | 'ready', actor: Actor) {
  return editSorting(studioId, sessionId, actor, async ({ tx, stacks, snapshot }) => {
    const stack = stackIn(stacks, stackId);
    assertEditable(stack);
    if (stack.state === state) return false;
    if (state === 'ready') {
      const frames = await framesOfStack(tx, stack.id);
      if (!frames.some((f) => !f.excluded)) throw fieldError('state', `Every frame of “${stack.name}” is excluded; include at least one before marking it ready.`);
    }
    await snapshot(state === 'ready' ? `mark ${stack.name} ready` : `return ${stack.name} to draft`);
    await tx.getRepository(Stack).update({ id: stack.id }, { state });
    await bumpVersions(tx, [stack.id]);
    await recordEvent(tx, stack.id, actor, state === 'ready' ? 'marked-ready' : 'back-to-draft', { from: stack.state });
    return true;
  });
}

/** The audit trail of one stack, newest first. */
export async function stackEvents(studioId: string, sessionId: string, stackId: string) {
  await sessionInStudio(studioId, sessionId);
  const ds = getDataSource();
  const stack = /^[0-9a-f-]{36}$/i.test(stackId) ? await ds.getRepository(Stack).findOneBy({ id: stackId, sessionId }) : null;
  if (!stack) throw new NotFound('No such stack in this session.');
  const rows: { action: string; actor_label: string; detail: Record<string, unknown>; at: Date }[] = await ds.query(
    `SELECT action, actor_label, detail, at FROM stack_events WHERE stack_id = $1 ORDER BY at DESC, id`,
    [stackId],
  );
  return rows.map((r) => ({ action: r.action, actor: r.actor_label, detail: r.detail, at: new Date(r.at).toISOString() }));
}

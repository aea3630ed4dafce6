// The small steps hand edits are made of, all inside the caller's transaction (after lockSession).
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import { Conflict, NotFound } from '../lib/errors';
import { Frame, Stack } from '../entities/session';
import { EDITABLE_STACK_STATES } from '../../shared/schemas/stack-edits';

export interface Actor {
  userId: string;
  label: string;
}

/** A 422 with the field path, shown beside the field like any validation error. */
export function fieldError(path: string, message: string): z.ZodError {
  return new z.ZodError([{ code: 'custom', path: [path], message, input: undefined }]);
}

const quote = (name: string) => `“${name}”`;

export function assertEditable(stack: Stack): void {
  if (!(EDITABLE_STACK_STATES as readonly string[]).includes(stack.state)) {
    throw new Conflict(
      `Stack ${quote(stack.name)} is ${stack.state}; only draft and ready stacks can be edited. It keeps its frames as they were handed on.`,
      { stackId: stack.id, state: stack.state },
    );
  }
}

export async function stacksOf(tx: EntityManager, sessionId: string): Promise<Stack[]> {
  return tx.getRepository(Stack).find({ where: { sessionId }, order: { position: 'ASC', createdAt: 'ASC' } });
}

export function stackIn(stacks: Stack[], stackId: string): Stack {
  const stack = stacks.find((s) => s.id === stackId);
  if (!stack) throw new NotFound('No such stack in this session.');
  return stack;
}

/** The frames of one stack in their stack order. */
export async function framesOfStack(tx: EntityManager, stackId: string): Promise<Frame[]> {
  return tx.getRepository(Frame).find({ where: { stackId }, order: { position: 'ASC', captureTimeMs: 'ASC' } });
}

/** The given frames of this session (each once), or 404 naming how many are unknown. */
export async function framesByIds(tx: EntityManager, sessionId: string, frameIds: string[]): Promise<Frame[]> {
  const unique = [...new Set(frameIds)];
  const frames = await tx.getRepository(Frame).createQueryBuilder('f')
    .where('f.session_id = :sessionId AND f.id IN (:...ids)', { sessionId, ids: unique }).getMany();
  if (frames.length !== unique.length) {
    const missing = unique.length - frames.length;
    throw new NotFound(`${missing} of the selected frames ${missing === 1 ? 'is' : 'are'} not in this session (reload to see the current sorting).`);
  }
  const byId = new Map(frames.map((f) => [f.id, f]));
  return unique.map((id) => byId.get(id)!);
}

/** Puts these frames into the stack (null: loose) in this order, positions 0, 1, 2 … */
export async function placeFrames(tx: EntityManager, stackId: string | null, frameIds: string[]): Promise<void> {
  if (frameIds.length === 0) return;
  await tx.query(
    `UPDATE frames f SET stack_id = $2, position = CASE WHEN $2::uuid IS NULL THEN 0 ELSE v.ord - 1 END
       FROM unnest($1::uuid[]) WITH ORDINALITY AS v(id, ord) WHERE f.id = v.id`,
    [frameIds, stackId],
  );
}

/** Stack positions 0, 1, 2 … in their current order, closing gaps left by removed stacks. */
export async function renumberStacks(tx: EntityManager, sessionId: string): Promise<void> {
  await tx.query(
    `UPDATE stacks s SET position = r.n - 1
       FROM (SELECT id, row_number() OVER (ORDER BY position, created_at) AS n FROM stacks WHERE session_id = $1) r
      WHERE s.id = r.id`,
    [sessionId],
  );
}

/** Every edit counts as a new version of the stack, so bundles and contact sheets made before go stale. */
export async function bumpVersions(tx: EntityManager, stackIds: string[]): Promise<void> {
  const ids = [...new Set(stackIds)];
  if (ids.length) await tx.query(`UPDATE stacks SET version = version + 1, updated_at = now() WHERE id = ANY($1::uuid[])`, [ids]);
}

export async function recordEvent(tx: EntityManager, stackId: string, actor: Actor, action: string, detail: Record<string, unknown>): Promise<void> {
  await tx.query(
    `INSERT INTO stack_events (stack_id, actor_id, actor_label, action, detail) VALUES ($1, $2, $3, $4, $5)`,
    [stackId, actor.userId, actor.label, action, JSON.stringify(detail)],
  );
}

/** "Stack 03" → "Stack 03 (2)", or the next free number, never a name the session already uses. */
export function nextFreeName(base: string, used: Set<string>): string {
  const stem = base.replace(/\s\(\d+\)$/, '');
  for (let n = 2; ; n++) {
    const name = `${stem} (${n})`;
    if (!used.has(name.toLowerCase())) return name;
  }
}

/** Inserts moved frames into a stack's order by capture time, keeping the stack's own order. */
export function mergeByCaptureTime(existing: Frame[], incoming: Frame[]): Frame[] {
  const time = (f: Frame) => f.captureTimeMs ?? Number.POSITIVE_INFINITY;
  const sorted = [...incoming].sort((a, b) => time(a) - time(b) || a.fileName.localeCompare(b.fileName));
  const out: Frame[] = [];
  let i = 0;
  for (const f of existing) {
    while (i < sorted.length && time(sorted[i]) < time(f)) out.push(sorted[i++]);
    out.push(f);
  }
  return out.concat(sorted.slice(i));
}

export const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

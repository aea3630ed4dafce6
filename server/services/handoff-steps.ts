// Small pieces the hand-off services share: the locked stack, audit rows, and the e-mails that
// go out through the worker's mail queue after a step has been committed.
import type { EntityManager } from 'typeorm';
import { getDataSource } from '../lib/data-source';
import { env } from '../lib/env';
import { enqueue } from '../lib/queues';
import { logger } from '../lib/logger';
import { Conflict } from '../lib/errors';
import { ShootSession, Stack } from '../entities/session';
import { lockSession } from './sorting-service';
import { stackInStudio } from './stack-access';
import { stepRefusal, type HandoffStep } from '../../shared/handoff-rules';

/** Who did a step: a signed-in person, or an outside retoucher through a share link. */
export interface HandoffActor {
  userId: string | null;
  label: string;
}

export interface LockedStack {
  tx: EntityManager;
  stack: Stack;
  session: ShootSession;
}

/**
 * Runs `fn` in one transaction holding the session's sorting lock (the same lock hand edits take,
 * so an edit and a hand-off never interleave), with the stack as it is now.
 */
export async function withLockedStack<T>(studioId: string, stackId: string, fn: (ctx: LockedStack) => Promise<T>): Promise<T> {
  const { session } = await stackInStudio(studioId, stackId);
  return getDataSource().transaction(async (tx) => {
    await lockSession(tx, session.id);
    const stack = await tx.getRepository(Stack).findOneByOrFail({ id: stackId });
    return fn({ tx, stack, session });
  });
}

/** 409 with the reason when the step may not start from the stack's state. */
export function assertStep(step: HandoffStep, stack: Stack): void {
  const refusal = stepRefusal(step, stack.state, stack.name);
  if (refusal) throw new Conflict(refusal, { stackId: stack.id, state: stack.state, step });
}

export async function recordHandoffEvent(tx: EntityManager, stackId: string, actor: HandoffActor, action: string, detail: Record<string, unknown>): Promise<string> {
  const rows: { id: string }[] = await tx.query(
    `INSERT INTO stack_events (stack_id, actor_id, actor_label, action, detail) VALUES ($1, $2, $3, $4, $5) RETURNING id`,
    [stackId, actor.userId, actor.label, action, JSON.stringify(detail)],
  );
  return rows[0].id;
}

/** The person who handed the stack off most recently: the one told about each later step. */
export async function handedOffBy(stackId: string): Promise<{ userId: string; email: string; name: string } | null> {
  const rows: { id: string; email: string; name: string }[] = await getDataSource().query(
    `SELECT u.id, u.email, u.name FROM stack_events e JOIN users u ON u.id = e.actor_id
      WHERE e.stack_id = $1 AND e.action = 'handed-off' ORDER BY e.at DESC LIMIT 1`,
    [stackId],
  );
  return rows[0] ? { userId: rows[0].id, email: rows[0].email, name: rows[0].name } : null;
}

export interface Mail {
  to: string;
  subject: string;
  text: string;
}

/**
 * Queues e-mails for one audit event. The job id names the event and the recipient, so the same
 * event never mails twice. A queue outage is logged, never undoes the step that was committed.
 */
export async function queueMails(eventId: string, mails: Mail[]): Promise<void> {
  for (const [i, mail] of mails.entries()) {
    try {
      await enqueue('mail', mail, `mail:${eventId}:${i}`);
    } catch (err) {
      logger.error({ err, eventId, to: mail.to }, 'could not queue hand-off mail');
    }
  }
}

export const quote = (name: string) => `“${name}”`;

/** "2026-12-08 14:03 UTC": readable in a message whatever the reader's zone. */
export function utcText(d: Date): string {
  return `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

export const shareUrl = (token: string) => `${env().PUBLIC_URL}/share/${token}`;
export const appUrl = (path: string) => `${env().PUBLIC_URL}${path}`;

/** A file size for a message: kB below a megabyte, else MB (decimal units). */
export function sizeText(bytes: number): string {
  return bytes < 1e6 ? `${Math.max(1, Math.round(bytes / 1e3))} kB` : `${(bytes / 1e6).toFixed(1)} MB`;
}

export const DAY_MS = 24 * 3600 * 1000;

// What the stack checks of one or more stacks are computed from, read in bulk: each stack's frames
// in order with their statistics and settings, its linked plan, its studio's thresholds, and a key
// naming that exact input (a stored run whose key matches is current).
// Excluded frames are left out: they are not merged, so their exposure or focus cannot harm the
// result; frames keep their stack-page numbers (counting excluded ones) in the messages.
import crypto from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import { Frame, ShootSession, Stack } from '../entities/session';
import { Plan } from '../entities/plan';
import { StudioCheckThresholds } from '../entities/stack-checks';
import { checkThresholdsSchema, frameStatsSchema, type CheckThresholds, type LinkedPlan, type StackCheckFrame } from '../../shared/schemas/checks';

export interface StackCheckState {
  stack: Stack;
  studioId: string;
  /** the checked (included) frames; index = place among all the stack's frames */
  frames: StackCheckFrame[];
  excludedFrames: number;
  plan: LinkedPlan | undefined;
  thresholds: CheckThresholds;
  /** included frames whose previews (and so statistics) are still being made */
  pendingPreviews: number;
  inputKey: string;
}

/** The studio's limits in force (its own where set, else the defaults) and what it set itself. */
export async function studioThresholds(manager: EntityManager, studioId: string): Promise<{ thresholds: CheckThresholds; custom: Partial<CheckThresholds>; updatedAt: Date | null }> {
  const row = await manager.getRepository(StudioCheckThresholds).findOneBy({ studioId });
  const stored = row?.thresholds ?? {};
  const custom = checkThresholdsSchema.partial().safeParse(stored);
  // A stored set that no longer passes (a limit narrowed in a later release) falls back to defaults;
  // partial() still fills in defaults, so only the stored names are kept as the studio's own.
  const own = custom.success ? Object.fromEntries(Object.entries(custom.data).filter(([key]) => key in stored)) : {};
  return { thresholds: checkThresholdsSchema.parse(own), custom: own, updatedAt: row?.updatedAt ?? null };
}

const positive = (v: number | null) => (v !== null && Number.isFinite(v) && v > 0 ? v : undefined);

function checkFrame(frame: Frame, index: number): StackCheckFrame {
  const stats = frameStatsSchema.safeParse(frame.stats);
  return {
    frameId: frame.id,
    index,
    fNumber: positive(frame.fNumber),
    focalLengthMm: positive(frame.focalLengthMm),
    iso: positive(frame.iso),
    captureTimeMs: frame.captureTimeMs !== null && Number.isFinite(frame.captureTimeMs) ? frame.captureTimeMs : undefined,
    meanLuminance: stats.success ? stats.data.meanLuminance : undefined,
    sharpnessGrid: stats.success && stats.data.sharpnessGrid.every(Number.isFinite) ? stats.data.sharpnessGrid : undefined,
  };
}

function linkedPlan(plan: Plan | undefined): LinkedPlan | undefined {
  if (!plan || !Number.isSafeInteger(plan.frames) || plan.frames < 1) return undefined;
  const stableSeconds = plan.inputs?.stableSeconds;
  return { frames: plan.frames, ...(typeof stableSeconds === 'number' && stableSeconds > 0 ? { stableSeconds } : {}) };
}

function keyOf(material: unknown): string {
  return crypto.createHash('sha256').update(JSON.stringify(material)).digest('hex').slice(0, 24);
}

/** The check input of every stack of a session, or of one stack. */
export async function loadCheckStates(manager: EntityManager, where: { sessionId: string } | { stackId: string }): Promise<StackCheckState[]> {
  const stacks = await manager.getRepository(Stack).find({ where: 'stackId' in where ? { id: where.stackId } : { sessionId: where.sessionId } });
  if (stacks.length === 0) return [];
  const sessionIds = [...new Set(stacks.map((s) => s.sessionId))];
  const sessions = await manager.getRepository(ShootSession).find({ where: { id: In(sessionIds) }, select: { id: true, studioId: true } });
  const studioOf = new Map(sessions.map((s) => [s.id, s.studioId]));
  const frames = await manager.getRepository(Frame).find({ where: { stackId: In(stacks.map((s) => s.id)) }, order: { position: 'ASC', captureTimeMs: 'ASC' } });
  const planIds = [...new Set(stacks.map((s) => s.planId).filter((id): id is string => id !== null))];
  const plans = planIds.length ? await manager.getRepository(Plan).find({ where: { id: In(planIds) } }) : [];
  const thresholdsByStudio = new Map<string, CheckThresholds>();
  for (const studioId of new Set(studioOf.values())) thresholdsByStudio.set(studioId, (await studioThresholds(manager, studioId)).thresholds);
  return stacks.flatMap((stack) => {
    const studioId = studioOf.get(stack.sessionId);
    if (!studioId) return [];
    const own = frames.filter((f) => f.stackId === stack.id);
    const included = own.map((f, index) => ({ f, index })).filter(({ f }) => !f.excluded);
    const plan = linkedPlan(plans.find((p) => p.id === stack.planId && p.studioId === studioId));
    const thresholds = thresholdsByStudio.get(studioId)!;
    const checked = included.map(({ f, index }) => checkFrame(f, index));
    const pending = included.filter(({ f }) => f.previewStatus === 'pending').map(({ f }) => f.id);
    return [{
      stack,
      studioId,
      frames: checked,
      excludedFrames: own.length - included.length,
      plan,
      thresholds,
      pendingPreviews: pending.length,
      inputKey: keyOf({ frames: checked, plan: plan ?? null, thresholds, pending }),
    }];
  });
}

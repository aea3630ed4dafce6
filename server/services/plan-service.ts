import { z } from 'zod';
import { getDataSource } from '../lib/data-source';
import { NotFound } from '../lib/errors';
import { Plan } from '../entities/plan';
import { apertureSweep, planStack } from '../../shared/optics';
import {
  planPatchSchema,
  planPreviewSchema,
  planSaveSchema,
  type PlanComputed,
  type PlanSave,
  type PlanSummary,
  type PlanView,
} from '../../shared/schemas/plan';
import { findKitItem } from './kit-service';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The one place figures come from: the shared engine, run on the server's copy of the inputs. */
export function computePlan(inputs: PlanSave['inputs']): PlanComputed {
  return { result: planStack(inputs), sweep: apertureSweep(inputs) };
}

export function previewPlan(body: unknown): PlanComputed {
  return computePlan(planPreviewSchema.parse(body).inputs);
}

function fieldError(path: (string | number)[], message: string): z.ZodError {
  return new z.ZodError([{ code: 'custom', path, message, input: undefined }]);
}

/** Kit ids must name this studio's kit, and tube positions must exist in the chosen set. */
async function checkKit(studioId: string, plan: PlanSave): Promise<void> {
  const { bodyId, lensId, extensionSetId, railId, tubeIndexes } = plan.kit;
  if (bodyId && !(await findKitItem(studioId, 'bodies', bodyId))) throw fieldError(['kit', 'bodyId'], 'That body is not in this studio’s kit.');
  if (lensId && !(await findKitItem(studioId, 'lenses', lensId))) throw fieldError(['kit', 'lensId'], 'That lens is not in this studio’s kit.');
  if (railId && !(await findKitItem(studioId, 'rails', railId))) throw fieldError(['kit', 'railId'], 'That rail is not in this studio’s kit.');
  if (extensionSetId) {
    const set = await findKitItem(studioId, 'extension-sets', extensionSetId);
    if (!set) throw fieldError(['kit', 'extensionSetId'], 'That extension set is not in this studio’s kit.');
    const bad = tubeIndexes.find((i) => i >= set.tubeLengthsMm.length);
    if (bad !== undefined) throw fieldError(['kit', 'tubeIndexes'], `The extension set has ${set.tubeLengthsMm.length} tubes; there is no tube ${bad + 1}.`);
  }
}

function columns(plan: PlanSave) {
  const { result, sweep } = computePlan(plan.inputs);
  return {
    name: plan.name,
    notes: plan.notes,
    inputs: plan.inputs,
    kit: plan.kit,
    focusingMethod: plan.focusingMethod,
    sessionId: plan.sessionId,
    result,
    sweep,
    magnification: result.magnification,
    frames: result.frames,
    stepMm: result.stepMm,
  };
}

function toView(p: Plan): PlanView {
  return {
    id: p.id,
    name: p.name,
    notes: p.notes,
    inputs: p.inputs,
    kit: p.kit,
    focusingMethod: p.focusingMethod,
    sessionId: p.sessionId,
    result: p.result,
    sweep: p.sweep,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
  };
}

function toSummary(p: Plan): PlanSummary {
  return {
    id: p.id,
    name: p.name,
    magnification: p.magnification,
    frames: p.frames,
    stepMm: p.stepMm,
    focusingMethod: p.focusingMethod,
    sessionId: p.sessionId,
    updatedAt: p.updatedAt.toISOString(),
  };
}

async function findPlan(studioId: string, planId: string): Promise<Plan> {
  const plan = UUID.test(planId) ? await getDataSource().getRepository(Plan).findOneBy({ id: planId, studioId }) : null;
  if (!plan) throw new NotFound('No such plan in this studio.');
  return plan;
}

export async function listPlans(studioId: string): Promise<PlanSummary[]> {
  const rows = await getDataSource()
    .getRepository(Plan)
    .find({
      select: { id: true, name: true, magnification: true, frames: true, stepMm: true, focusingMethod: true, sessionId: true, updatedAt: true },
      where: { studioId },
      order: { updatedAt: 'DESC' },
    });
  return rows.map(toSummary);
}

export async function getPlan(studioId: string, planId: string): Promise<PlanView> {
  return toView(await findPlan(studioId, planId));
}

/** Saves a new plan; figures sent by the client are ignored and computed here. */
export async function createPlan(studioId: string, userId: string, body: unknown): Promise<PlanView> {
  const plan = planSaveSchema.parse(body);
  await checkKit(studioId, plan);
  const repo = getDataSource().getRepository(Plan);
  return toView(await repo.save(repo.create({ ...columns(plan), studioId, createdBy: userId })));
}

/** A partial change merged with the stored plan, validated whole and recomputed; on any error nothing changes. */
export async function updatePlan(studioId: string, planId: string, body: unknown): Promise<PlanView> {
  const patch = planPatchSchema.parse(body);
  const defined = Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined));
  return getDataSource().transaction(async (tx) => {
    const repo = tx.getRepository(Plan);
    const row = UUID.test(planId) ? await repo.findOne({ where: { id: planId, studioId }, lock: { mode: 'pessimistic_write' } }) : null;
    if (!row) throw new NotFound('No such plan in this studio.');
    const { name, notes, inputs, kit, focusingMethod, sessionId } = row;
    const merged = planSaveSchema.parse({ name, notes, inputs, kit, focusingMethod, sessionId, ...defined });
    await checkKit(studioId, merged);
    return toView(await repo.save(repo.merge(row, columns(merged))));
  });
}

/** A copy under a new name, recomputed with today's engine, not linked to any session. */
export async function duplicatePlan(studioId: string, userId: string, planId: string): Promise<PlanView> {
  const source = await findPlan(studioId, planId);
  const copy = planSaveSchema.parse({
    name: `${source.name} (copy)`.slice(0, 120),
    notes: source.notes,
    inputs: source.inputs,
    kit: source.kit,
    focusingMethod: source.focusingMethod,
    sessionId: null,
  });
  const repo = getDataSource().getRepository(Plan);
  return toView(await repo.save(repo.create({ ...columns(copy), studioId, createdBy: userId })));
}

export async function deletePlan(studioId: string, planId: string): Promise<void> {
  const plan = await findPlan(studioId, planId);
  await getDataSource().getRepository(Plan).delete({ id: plan.id, studioId });
}

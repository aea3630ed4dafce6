import { z } from 'zod';
import { planInputSchema, type ApertureSweep, type PlanInput, type StackPlan } from './plan-input';

export const FOCUSING_METHODS = ['rail', 'camera'] as const;
export const focusingMethodSchema = z.enum(FOCUSING_METHODS, { error: 'Pick rail or camera.' });
export type FocusingMethod = z.infer<typeof focusingMethodSchema>;

const kitId = z.uuid('Not a kit item id.').nullable();

/** Which kit the plan used; every part is optional because values can be typed directly. */
export const planKitSchema = z
  .object({
    bodyId: kitId.default(null),
    lensId: kitId.default(null),
    extensionSetId: kitId.default(null),
    /** Positions in the extension set's tube list of the tubes combined. */
    tubeIndexes: z.array(z.number().int().min(0).max(11)).max(12).default([]),
    railId: kitId.default(null),
  })
  .refine((k) => new Set(k.tubeIndexes).size === k.tubeIndexes.length, { path: ['tubeIndexes'], message: 'Each tube can be used once.' })
  .refine((k) => k.tubeIndexes.length === 0 || k.extensionSetId !== null, { path: ['tubeIndexes'], message: 'Tubes need an extension set.' });
export type PlanKit = z.output<typeof planKitSchema>;
export const EMPTY_PLAN_KIT: PlanKit = { bodyId: null, lensId: null, extensionSetId: null, tubeIndexes: [], railId: null };

const planFields = {
  name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name for the plan.').max(120, 'Use at most 120 characters.'),
  notes: z.string({ error: 'Notes are text.' }).max(5000, 'Notes are limited to 5000 characters.'),
  inputs: planInputSchema,
  kit: planKitSchema,
  focusingMethod: focusingMethodSchema,
  /** Link to a shooting session (sessions come later; no foreign key yet). */
  sessionId: z.uuid('Not a session id.').nullable(),
};

function checkFocusing(p: { focusingMethod: FocusingMethod; inputs: PlanInput }, ctx: z.RefinementCtx) {
  const hasStep = p.inputs.railStepUm !== undefined;
  if (p.focusingMethod === 'rail' && !hasStep) {
    ctx.addIssue({ code: 'custom', path: ['inputs', 'railStepUm'], message: 'Pick a rail or enter its smallest step in µm.' });
  }
  if (p.focusingMethod === 'camera' && hasStep) {
    ctx.addIssue({ code: 'custom', path: ['inputs', 'railStepUm'], message: 'Moving the camera has no rail step: clear it, or choose the rail.' });
  }
}

/**
 * A plan as the client sends it. Computed figures are not part of it: anything else in the body
 * (frames, steps, results) is dropped and the server computes them again.
 */
export const planSaveSchema = z
  .object({
    ...planFields,
    notes: planFields.notes.default(''),
    kit: planKitSchema.default(EMPTY_PLAN_KIT),
    sessionId: planFields.sessionId.default(null),
  })
  .superRefine(checkFocusing);
export type PlanSaveInput = z.input<typeof planSaveSchema>;
export type PlanSave = z.output<typeof planSaveSchema>;

/** PATCH: any subset; `inputs` and `kit` replace the stored ones whole. */
export const planPatchSchema = z.object(planFields).partial();
export type PlanPatch = z.input<typeof planPatchSchema>;

/** Inputs checked together with the focusing method, for the compute-only preview. */
export const planPreviewSchema = z.object({ inputs: planInputSchema, focusingMethod: focusingMethodSchema }).superRefine(checkFocusing);

export interface PlanComputed {
  result: StackPlan;
  sweep: ApertureSweep;
}

export interface PlanView extends PlanSave, PlanComputed {
  id: string;
  createdAt: string;
  updatedAt: string;
}

export interface PlanSummary {
  id: string;
  name: string;
  magnification: number;
  frames: number;
  stepMm: number | null;
  focusingMethod: FocusingMethod;
  sessionId: string | null;
  updatedAt: string;
}

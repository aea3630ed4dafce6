import { z } from 'zod';

// Hand edits on the sorting of a session: split, merge, move, exclude, rename, link, reorder, state.
const id = z.uuid('Use the id of a frame or stack of this session.');
const frameIds = z.array(id).min(1, 'Select at least one frame.').max(10_000);

export const splitStackSchema = z.object({ frameId: id });

export const moveFramesSchema = z.object({
  frameIds,
  /** null makes them loose frames. */
  toStackId: id.nullable(),
});

export const excludeFramesSchema = z.object({ frameIds, excluded: z.boolean() });

// Control characters would end up in bundle folder names and the contact sheet.
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/;

export const stackPatchSchema = z
  .object({
    name: z.string().trim().min(1, 'Give the stack a name.').max(120, 'Keep the name under 120 characters.')
      .refine((s) => !CONTROL_CHARACTERS.test(s), 'The name contains control characters.').optional(),
    /** null unlinks the plan. */
    planId: z.uuid('Pick one of the studio’s plans.').nullable().optional(),
  })
  .refine((p) => p.name !== undefined || p.planId !== undefined, 'Send a new name or a plan to link.');

export const reorderFramesSchema = z.object({ frameIds });

/** Only draft ↔ ready here; the states after ready belong to the hand-off. */
export const EDITABLE_STACK_STATES = ['draft', 'ready'] as const;
export const stackStateChangeSchema = z.object({ state: z.enum(EDITABLE_STACK_STATES) });

export type StackPatch = z.infer<typeof stackPatchSchema>;

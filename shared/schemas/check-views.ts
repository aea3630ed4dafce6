import { z } from 'zod';
import { checkThresholdsSchema, SHARPNESS_GRID_CELLS, stackCheckSchema } from './checks';

/** A check with the stack page's numbers of its frames (1-based, counting excluded frames too). */
export const numberedCheckSchema = stackCheckSchema.extend({ frameNumbers: z.array(z.number().int().positive()) });
export type NumberedCheck = z.infer<typeof numberedCheckSchema>;

export const checkedFrameSchema = z.object({
  frameId: z.string(),
  /** the frame's number on the stack page */
  number: z.number().int().positive(),
  /** gamma-encoded mean luma 0..1, null while (or where) it could not be measured */
  meanLuminance: z.number().min(0).max(1).nullable(),
  /** exposure against the stack's median, stops */
  stops: z.number().nullable(),
});
export type CheckedFrame = z.infer<typeof checkedFrameSchema>;

export const focusMapSchema = z.object({
  gridCols: z.literal(8),
  gridRows: z.literal(6),
  /** row-major; the number of the frame sharpest in each cell, null where the cell holds no detail */
  sharpestFrameNumbers: z.array(z.number().int().positive().nullable()).length(SHARPNESS_GRID_CELLS),
});
export type FocusMap = z.infer<typeof focusMapSchema>;

/** What one run of the checks stores: the checks and the numbers behind the pictures. */
export const stackCheckResultsSchema = z.object({
  checks: z.array(numberedCheckSchema),
  /** the frames that were checked (excluded frames are left out), in stack order */
  frames: z.array(checkedFrameSchema),
  excludedFrames: z.number().int().nonnegative(),
  /** null when fewer than three frames were measured */
  focusMap: focusMapSchema.nullable(),
});
export type StackCheckResults = z.infer<typeof stackCheckResultsSchema>;

export const stackChecksStatusSchema = z.enum(['current', 'updating', 'waiting-for-previews']);
export type StackChecksStatus = z.infer<typeof stackChecksStatusSchema>;

export const stackChecksViewSchema = z.object({
  stackId: z.string(),
  stackVersion: z.number().int(),
  /**
   * current: the results describe the stack as it is now; updating: a run for the latest change
   * is queued (the results shown, if any, are from before it); waiting-for-previews: some frames
   * are not measured yet, the checks run once they are.
   */
  status: stackChecksStatusSchema,
  previews: z.object({ total: z.number().int(), pending: z.number().int() }),
  /** null before the first run */
  results: stackCheckResultsSchema.nullable(),
  resultsStackVersion: z.number().int().nullable(),
  computedAt: z.string().nullable(),
  /** the limits the results were computed with (the studio's current ones before the first run) */
  thresholds: checkThresholdsSchema,
});
export type StackChecksView = z.infer<typeof stackChecksViewSchema>;

export const checkThresholdsViewSchema = z.object({
  /** the limits in force: the studio's own where set, else the defaults */
  thresholds: checkThresholdsSchema,
  /** only the limits the studio set */
  custom: checkThresholdsSchema.partial(),
  defaults: checkThresholdsSchema,
  updatedAt: z.string().nullable(),
});
export type CheckThresholdsView = z.infer<typeof checkThresholdsViewSchema>;

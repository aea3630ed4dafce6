import { z } from 'zod';

export const checkCodeSchema = z.enum(['exposure-jump', 'focus-gap', 'duplicate-frame', 'setting-change', 'plan-mismatch']);
export type CheckCode = z.infer<typeof checkCodeSchema>;

export const checkSeveritySchema = z.enum(['info', 'warning', 'problem']);
export type CheckSeverity = z.infer<typeof checkSeveritySchema>;

export const SHARPNESS_GRID_CELLS = 8 * 6;

/** What the worker stores per frame (see worker/lib/frame-stats.ts). */
export const frameStatsSchema = z.object({
  meanLuminance: z.number().min(0).max(1),
  sharpnessGrid: z.array(z.number().nonnegative()).length(SHARPNESS_GRID_CELLS),
  gridCols: z.literal(8),
  gridRows: z.literal(6),
  widthPx: z.number().int().positive(),
  heightPx: z.number().int().positive(),
});
export type FrameStatsRecord = z.infer<typeof frameStatsSchema>;

/**
 * Limits a studio can tune. Each is in the unit a photographer reads: stops, or a ratio of the
 * stack's own focus step.
 */
export const checkThresholdsSchema = z
  .object({
    /** a frame this far (stops) from its neighbours is an exposure jump; 1/3 stop is a visible band */
    exposureJumpStops: z.number().min(0.05).max(4).default(1 / 3),
    /** a focus move this many times the stack's usual step (measured locally) is a focus gap */
    focusGapStepRatio: z.number().min(1.1).max(6).default(1.6),
    /** grid cells whose sharpness varies less than this factor over the stack carry no focus signal */
    focusCellMinContrast: z.number().min(1.2).max(100).default(3),
    /** a pair of frames whose sharpness changes by less than this fraction of the stack's usual change is a duplicate */
    duplicateChangeRatio: z.number().min(0.01).max(0.9).default(0.25),
    /** ... provided their exposures differ by less than this (stops) */
    duplicateMaxStops: z.number().min(0).max(2).default(0.1),
    /** frames more or fewer than the linked plan before it counts as a mismatch */
    planFrameTolerance: z.number().int().min(0).max(1000).default(0),
  })
  .strict();
export type CheckThresholds = z.infer<typeof checkThresholdsSchema>;
/** For a studio's saved settings: any subset, the rest from the defaults. */
export const checkThresholdsInputSchema = checkThresholdsSchema.partial();

export const stackCheckFrameSchema = z.object({
  frameId: z.string().min(1),
  /** 0-based position in the stack; messages number frames from 1, as the contact sheet does */
  index: z.number().int().nonnegative(),
  fNumber: z.number().positive().optional(),
  focalLengthMm: z.number().positive().optional(),
  iso: z.number().positive().optional(),
  captureTimeMs: z.number().finite().optional(),
  meanLuminance: z.number().min(0).max(1).optional(),
  sharpnessGrid: z.array(z.number().nonnegative().finite()).length(SHARPNESS_GRID_CELLS).optional(),
});
export type StackCheckFrame = z.infer<typeof stackCheckFrameSchema>;

export const linkedPlanSchema = z.object({
  frames: z.number().int().positive(),
  /** how long the subject holds still (a drop evaporating, a flower wilting), s */
  stableSeconds: z.number().positive().optional(),
});
export type LinkedPlan = z.infer<typeof linkedPlanSchema>;

export const stackChecksInputSchema = z.object({
  frames: z.array(stackCheckFrameSchema),
  plan: linkedPlanSchema.optional(),
  thresholds: checkThresholdsInputSchema.optional(),
});
export type StackChecksInput = z.input<typeof stackChecksInputSchema>;

export const checkRegionSchema = z.object({
  gridCols: z.literal(8),
  gridRows: z.literal(6),
  /** row-major cell numbers, 0 = top left */
  cells: z.array(z.number().int().min(0).max(SHARPNESS_GRID_CELLS - 1)),
});
export type CheckRegion = z.infer<typeof checkRegionSchema>;

export const stackCheckSchema = z.object({
  code: checkCodeSchema,
  severity: checkSeveritySchema,
  /** the frames concerned, in stack order; empty when it is about the whole stack */
  frameIds: z.array(z.string()),
  message: z.string().min(1),
  region: checkRegionSchema.optional(),
});
export type StackCheck = z.infer<typeof stackCheckSchema>;

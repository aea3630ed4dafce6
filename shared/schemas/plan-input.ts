import { z } from 'zod';

// z.number() refuses NaN, ±Infinity and strings (no coercion), so every field below is finite.
const positive = () => z.number().positive();

export const sensorSchema = z.object({
  widthMm: positive().max(200),
  heightMm: positive().max(200),
  pixelsAcross: z.number().int().min(100).max(100_000),
});
export type Sensor = z.infer<typeof sensorSchema>;

export const dofModelSchema = z.enum(['geometric', 'wave']);
export type DofModel = z.infer<typeof dofModelSchema>;

/**
 * Inputs of a stack plan. Optional fields fall back to: baseMagnification 0 (lens at infinity),
 * pupilMagnification 1 (symmetric lens), wavelengthUm 0.55 (green).
 * `numericalAperture` (a microscope objective's subject-side NA) replaces `fNumber` when given;
 * `fNumber` is still required so the aperture sweep and the form keep one shape.
 * `secondsPerFrame` is the whole cycle per frame (exposure + settle); `exposureTimeS` only drives
 * the vibration caution.
 */
export const planInputSchema = z
  .object({
    focalLengthMm: z.number().min(1).max(2000),
    extensionMm: z.number().min(0).max(1000),
    baseMagnification: z.number().min(0).max(200).optional(),
    pupilMagnification: z.number().min(0.05).max(20).optional(),
    fNumber: z.number().min(0.5).max(128),
    cocMm: z.number().min(0.0001, 'cocMm must be at least 0.0001 mm (0.1 µm)').max(1),
    sensor: sensorSchema,
    depthMm: positive().max(1000, 'depthMm must be at most 1000 mm (1 m)'),
    overlap: z.number().min(0).lt(1, 'overlap is a fraction below 1 (0.2 = 20 %)'),
    dofModel: dofModelSchema,
    wavelengthUm: z.number().min(0.3).max(1.2).optional(),
    railStepUm: z.number().min(0.01, 'railStepUm must be at least 0.01 µm').max(100_000).optional(),
    secondsPerFrame: z.number().min(0).max(86_400).optional(),
    stableSeconds: positive().optional(),
    numericalAperture: positive().lt(1.6).optional(),
    exposureTimeS: positive().max(3600).optional(),
  })
  .refine(
    (p) => p.exposureTimeS === undefined || p.secondsPerFrame === undefined || p.secondsPerFrame >= p.exposureTimeS,
    { path: ['secondsPerFrame'], message: 'secondsPerFrame (exposure + settle) must be at least exposureTimeS' },
  );
export type PlanInput = z.infer<typeof planInputSchema>;

export const planWarningCodeSchema = z.enum([
  'no-magnification',
  'dof-unbounded',
  'too-many-frames',
  'rail-too-coarse',
  'overlap-reduced',
  'diffraction-soft',
  'all-diffraction-soft',
  'over-time',
  'vibration-risk',
  'fixed-aperture',
]);
export type PlanWarningCode = z.infer<typeof planWarningCodeSchema>;

export const planWarningSchema = z.object({ code: planWarningCodeSchema, message: z.string() });
export type PlanWarning = z.infer<typeof planWarningSchema>;

/**
 * A computed plan. Plans are stored as JSON, so quantities that are infinite are `null`:
 * - `frameDofMm`, `stepMm`: null when one frame's depth of field is unbounded (no magnification,
 *   or focused at or beyond the hyperfocal distance); `frames` is then 1.
 * - `fieldWidthMm`, `fieldHeightMm`: null at zero magnification.
 * - `shootSeconds`: null without `secondsPerFrame`; `railSteps`: null without `railStepUm`.
 * `positionsMm` (and `railSteps`) hold at most MAX_LISTED_POSITIONS entries;
 * `positionsTruncated` says when `frames` is larger.
 */
export const stackPlanSchema = z.object({
  magnification: z.number(),
  workingFNumber: z.number(),
  lightLossStops: z.number(),
  frameDofMm: z.number().nullable(),
  stepMm: z.number().nullable(),
  frames: z.number(), // a whole count; only an absurd overlap pushes it past 2^53
  positionsMm: z.array(z.number()),
  positionsTruncated: z.boolean(),
  railSteps: z.array(z.number()).nullable(),
  airyDiskUm: z.number(),
  pixelPitchUm: z.number(),
  fieldWidthMm: z.number().nullable(),
  fieldHeightMm: z.number().nullable(),
  shootSeconds: z.number().nullable(),
  warnings: z.array(planWarningSchema),
});
export type StackPlan = z.infer<typeof stackPlanSchema>;

/** One aperture of the sweep: the plan's figures without its position lists. */
export const apertureSweepRowSchema = stackPlanSchema.omit({ positionsMm: true, railSteps: true }).extend({
  fNumber: z.number(),
  airyDiskPx: z.number(),
  diffractionSoft: z.boolean(),
  overTime: z.boolean(),
});
export type ApertureSweepRow = z.infer<typeof apertureSweepRowSchema>;

export const apertureSweepSchema = z.object({
  rows: z.array(apertureSweepRowSchema),
  recommendedFNumber: z.number(),
  warnings: z.array(planWarningSchema),
});
export type ApertureSweep = z.infer<typeof apertureSweepSchema>;

export const fNumberListSchema = z.array(z.number().min(0.5).max(128)).min(1);

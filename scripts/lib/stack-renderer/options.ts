import { z } from 'zod';
import { sceneKinds } from './scene';

const frameIndex = z.number().int().min(0);

export const stackFaultsSchema = z
  .object({
    /** frame index whose exposure is off (a moved lamp) */
    exposureJumpAt: frameIndex.optional(),
    /** size of that jump, stops; +1 doubles the light */
    exposureStops: z.number().min(-4).max(4).refine((stops) => stops !== 0, 'exposureStops must not be 0').optional(),
    /** the lamp stays where it was moved: every later frame keeps the new exposure */
    exposureJumpPersists: z.boolean().optional(),
    /** after this frame the focus moves two steps instead of one */
    skipStepAt: frameIndex.optional(),
    /** the frame after this one is shot again at the same focus */
    repeatAt: frameIndex.optional(),
  })
  .strict();

const timeSchema = z.union([
  z.number().int().nonnegative(),
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,3})?(Z|[+-]\d{2}:\d{2})$/, 'startTime must be ISO 8601 with an offset, like 2026-05-14T07:12:03.120+02:00'),
]);

export const renderStackOptionsSchema = z
  .object({
    seed: z.number().int().default(1),
    widthPx: z.number().int().min(48).max(4000).default(800),
    heightPx: z.number().int().min(32).max(4000).default(533),
    frameCount: z.number().int().min(3).max(400).default(20),
    depthRangeMm: z.tuple([z.number(), z.number()]).default([0, 4]),
    scene: z.enum(sceneKinds).default('drop-on-leaf'),
    startTime: timeSchema.default('2026-05-14T07:12:03.120+02:00'),
    /** offset written to OffsetTimeOriginal; by default the one in startTime, else UTC */
    utcOffsetMinutes: z.number().int().min(-720).max(840).optional(),
    intervalS: z.tuple([z.number().positive(), z.number().positive()]).default([2, 6]),
    bodySerial: z.string().min(1).max(40).default('LMD-20417'),
    fNumber: z.number().min(0.7).max(128).default(8),
    exposureTimeS: z.number().positive().max(3600).default(1 / 160),
    iso: z.number().int().min(1).max(409600).default(200),
    focalLengthMm: z.number().positive().max(2000).default(100),
    orientation: z.union([z.literal(1), z.literal(3), z.literal(6), z.literal(8)]).default(1),
    filePrefix: z.string().regex(/^[A-Z0-9_]{1,8}$/, 'filePrefix: up to 8 capitals, digits or _').default('FRN_'),
    firstFileNumber: z.number().int().min(1).max(9999).default(1),
    withRaw: z.boolean().default(false),
    jpegQuality: z.number().int().min(40).max(100).default(92),
    /** Gaussian sigma of the blur one focus step away, px; by default 1.2 px per 800 px of width */
    blurSigmaPxPerStep: z.number().positive().max(20).optional(),
    /** sensor grain, standard deviation in 8-bit code values */
    grainDn: z.number().min(0).max(20).default(1),
    /** frame-to-frame flicker of the light, +- stops (uniform) */
    exposureJitterStops: z.number().min(0).max(0.2).default(0.02),
    /** extra exposure per frame, stops (for measuring exposure steps) */
    exposureStopsByFrame: z.array(z.number().min(-6).max(6)).optional(),
    faults: stackFaultsSchema.default({}),
  })
  .strict()
  .superRefine((options, ctx) => {
    const last = options.frameCount - 1;
    const { exposureJumpAt, skipStepAt, repeatAt } = options.faults;
    if (options.depthRangeMm[1] <= options.depthRangeMm[0]) {
      ctx.addIssue({ code: 'custom', path: ['depthRangeMm'], message: 'the far end of depthRangeMm must be deeper than the near end' });
    }
    if (options.intervalS[1] < options.intervalS[0]) {
      ctx.addIssue({ code: 'custom', path: ['intervalS'], message: 'intervalS must be [shortest, longest]' });
    }
    if (exposureJumpAt !== undefined && exposureJumpAt > last) {
      ctx.addIssue({ code: 'custom', path: ['faults', 'exposureJumpAt'], message: `exposureJumpAt must be a frame index from 0 to ${last}` });
    }
    for (const key of ['skipStepAt', 'repeatAt'] as const) {
      const at = key === 'skipStepAt' ? skipStepAt : repeatAt;
      if (at !== undefined && at > last - 1) {
        ctx.addIssue({ code: 'custom', path: ['faults', key], message: `${key} must be a frame index from 0 to ${last - 1} (a later frame must exist)` });
      }
    }
    if (options.exposureStopsByFrame && options.exposureStopsByFrame.length !== options.frameCount) {
      ctx.addIssue({ code: 'custom', path: ['exposureStopsByFrame'], message: `exposureStopsByFrame needs one value per frame (${options.frameCount})` });
    }
  });

export type RenderStackOptions = z.input<typeof renderStackOptionsSchema>;
export type ResolvedStackOptions = z.output<typeof renderStackOptionsSchema>;
export type StackFaults = z.output<typeof stackFaultsSchema>;

/** Turns a zod failure into one readable sentence naming each bad option. */
export function parseRenderStackOptions(options: RenderStackOptions): ResolvedStackOptions {
  const parsed = renderStackOptionsSchema.safeParse(options);
  if (parsed.success) return parsed.data;
  const problems = parsed.error.issues.map((issue) => `${issue.path.join('.') || 'options'}: ${issue.message}`);
  throw new RangeError(`Cannot render the stack: ${problems.join('; ')}`);
}

export function startTimeMs(startTime: number | string): number {
  return typeof startTime === 'number' ? startTime : Date.parse(startTime);
}

export function offsetMinutesOf(startTime: number | string): number {
  if (typeof startTime === 'number') return 0;
  const match = /([+-])(\d{2}):(\d{2})$/.exec(startTime);
  if (!match) return 0;
  const minutes = Number(match[2]) * 60 + Number(match[3]);
  return match[1] === '-' ? -minutes : minutes;
}

import { z } from 'zod';
import { renderStack, type RenderedFile, type StackTruth } from './render-stack';
import { createRandom, randomBetween } from './noise';
import { offsetMinutesOf, stackFaultsSchema, startTimeMs } from './options';
import { sceneKinds } from './scene';

const cardStackSchema = z
  .object({
    frameCount: z.number().int().min(3).max(400).default(20),
    scene: z.enum(sceneKinds).default('drop-on-leaf'),
    faults: stackFaultsSchema.default({}),
    withRaw: z.boolean().default(false),
    fNumber: z.number().min(0.7).max(128).optional(),
    focalLengthMm: z.number().positive().max(2000).optional(),
    iso: z.number().int().min(1).max(409600).optional(),
    bodySerial: z.string().min(1).max(40).optional(),
    /** test shots just before the stack (1 or 2, so they stay loose frames) */
    testShots: z.number().int().min(0).max(2).optional(),
  })
  .strict();

export const cardOptionsSchema = z
  .object({
    seed: z.number().int().default(1),
    widthPx: z.number().int().min(48).max(4000).default(800),
    heightPx: z.number().int().min(32).max(4000).default(533),
    startTime: z.string().default('2026-05-14T06:48:10.000+02:00'),
    bodySerial: z.string().min(1).max(40).default('LMD-20417'),
    firstFileNumber: z.number().int().min(1).max(9999).default(1),
    /** minutes between the end of one stack and the next test shot */
    minutesBetweenStacks: z.tuple([z.number().positive(), z.number().positive()]).default([3, 12]),
    // prefault: the default goes through the schema, so each stack gets its own defaults
    stacks: z.array(cardStackSchema).min(1).max(40).prefault([
      { frameCount: 18, scene: 'drop-on-leaf', withRaw: true },
      { frameCount: 14, scene: 'beetle', faults: { exposureJumpAt: 6 } },
      { frameCount: 12, scene: 'drop-on-leaf', faults: { skipStepAt: 5 } },
    ]),
  })
  .strict();

export type CardOptions = z.input<typeof cardOptionsSchema>;

export interface CardStackTruth {
  scene: (typeof sceneKinds)[number];
  /** every file of the stack in capture order (raw-like before JPEG of the same frame) */
  fileNames: string[];
  truth: StackTruth;
}

export interface RenderedCard {
  files: (RenderedFile & { stackIndex: number | null })[];
  truth: { stacks: CardStackTruth[]; looseFrames: string[] };
}

/**
 * A memory card's worth of frames: stacks separated by minutes, each preceded by one or two
 * test shots at another shutter time, with file numbers running on across the card.
 */
export async function renderCard(input: CardOptions = {}): Promise<RenderedCard> {
  const parsed = cardOptionsSchema.safeParse(input);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.') || 'options'}: ${issue.message}`);
    throw new RangeError(`Cannot render the card: ${problems.join('; ')}`);
  }
  const options = parsed.data;
  const random = createRandom(options.seed * 104729 + 3);
  const utcOffsetMinutes = offsetMinutesOf(options.startTime);
  let clockMs = startTimeMs(options.startTime);
  let fileNumber = options.firstFileNumber;
  const files: RenderedCard['files'] = [];
  const stacks: CardStackTruth[] = [];
  const looseFrames: string[] = [];
  for (const [stackIndex, spec] of options.stacks.entries()) {
    const seed = options.seed * 1000 + stackIndex * 37 + 1;
    const common = {
      seed,
      widthPx: options.widthPx,
      heightPx: options.heightPx,
      scene: spec.scene,
      utcOffsetMinutes,
      bodySerial: spec.bodySerial ?? options.bodySerial,
      fNumber: spec.fNumber,
      focalLengthMm: spec.focalLengthMm,
      iso: spec.iso,
    };
    const testShots = spec.testShots ?? (random() < 0.5 ? 1 : 2);
    if (testShots > 0) {
      const tests = await renderStack({
        ...common,
        frameCount: 3,
        startTime: clockMs,
        intervalS: [9, 40],
        exposureTimeS: 1 / (random() < 0.5 ? 80 : 320),
        firstFileNumber: fileNumber,
      });
      for (const file of tests.files.filter((f) => f.frameIndex < testShots)) {
        files.push({ ...file, stackIndex: null });
        looseFrames.push(file.name);
      }
      clockMs = tests.truth.captureTimesMs[testShots - 1] + Math.round(randomBetween(random, 25, 80) * 1000);
      fileNumber += testShots;
    }
    const stack = await renderStack({
      ...common,
      frameCount: spec.frameCount,
      faults: spec.faults,
      withRaw: spec.withRaw,
      startTime: clockMs,
      firstFileNumber: fileNumber,
    });
    for (const file of stack.files) files.push({ ...file, stackIndex });
    stacks.push({ scene: spec.scene, fileNames: stack.files.map((f) => f.name), truth: stack.truth });
    fileNumber += spec.frameCount;
    const [shortestMin, longestMin] = options.minutesBetweenStacks;
    clockMs = stack.truth.captureTimesMs[spec.frameCount - 1] + Math.round(randomBetween(random, shortestMin, longestMin) * 60_000);
  }
  return { files, truth: { stacks, looseFrames } };
}

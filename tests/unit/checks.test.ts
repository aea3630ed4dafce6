import { describe, expect, it } from 'vitest';
import { CHECK_GLYPHS, defaultCheckThresholds, relativeStops, runStackChecks } from '@shared/checks';
import { checkCodeSchema, checkThresholdsSchema, type StackCheck, type StackCheckFrame } from '@shared/schemas/checks';
import { createRandom } from '../../scripts/lib/stack-renderer/noise';
import { renderStack, type RenderStackOptions, type StackFaults } from '../../scripts/lib/stack-renderer';
import { computeFrameStats } from '../../worker/lib/frame-stats';

/** sRGB encoding, IEC 61966-2-1:1999 section 5.3: the inverse of what the checks decode. */
const encodeSrgb = (linear: number) => (linear <= 0.0031308 ? 12.92 * linear : 1.055 * linear ** (1 / 2.4) - 0.055);
const frameAt = (index: number, extra: Partial<StackCheckFrame> = {}): StackCheckFrame => ({ frameId: `f${index}`, index, ...extra });
const summary = (checks: StackCheck[]) => checks.map((check) => `${check.code}:${check.frameIds.join(',')}`);

describe('relativeStops', () => {
  it('reads exact stops from luminances encoded with the sRGB curve', () => {
    const linear = [0.18, 0.18 * 2, 0.18 / 2, 0.18 * 2 ** (1 / 3), 0.002];
    const stops = relativeStops(linear.map(encodeSrgb));
    const expected = linear.map((value) => Math.log2(value / 0.18));
    stops.forEach((value, i) => expect(value).toBeCloseTo(expected[i], 6));
  });

  it('does not return -Infinity for a black frame', () => {
    expect(Number.isFinite(relativeStops([0, 0.5, 0.5])[0])).toBe(true);
  });

  it.each([[[0.5, Number.NaN]], [[0.5, 1.2]], [[-0.1]]])('rejects %j with the bad index', (values) => {
    expect(() => relativeStops(values)).toThrow(/meanLuminances\[\d\] is .*between 0 and 1/);
  });
});

describe('exposure jumps (luminance only)', () => {
  const frames = (stops: number[]) => stops.map((s, i) => frameAt(i, { meanLuminance: encodeSrgb(0.2 * 2 ** s) }));

  it.each([
    ['steady light with flicker', [0, 0.05, -0.04, 0.02, 0, -0.03], []],
    ['one frame a stop bright', [0, 0, 0, 1, 0, 0], ['f3']],
    ['one frame half a stop dark', [0, 0.02, -0.5, 0, 0.01, 0], ['f2']],
    ['a lamp moved and left there', [0, 0, 0, 0, -0.7, -0.7, -0.7], ['f4']],
    ['the first frame off', [0.8, 0, 0, 0, 0], ['f0']],
    ['the last frame off', [0, 0, 0, 0, 0.8], ['f4']],
    ['a quarter stop: under the 1/3 stop default', [0, 0, 0.25, 0, 0], []],
  ])('%s', (_, stops, flagged) => {
    const checks = runStackChecks({ frames: frames(stops) });
    expect(checks.every((c) => c.code === 'exposure-jump' && c.severity === 'warning')).toBe(true);
    expect(checks.flatMap((c) => c.frameIds)).toEqual(flagged);
  });

  it('follows a studio threshold', () => {
    expect(runStackChecks({ frames: frames([0, 0, 0.25, 0, 0]), thresholds: { exposureJumpStops: 0.2 } })).toHaveLength(1);
  });

  it('says what happened and what to do', () => {
    const [check] = runStackChecks({ frames: frames([0, 0, 1, 0, 0]) });
    expect(check.message).toMatch(/Frame 3 is 1\.0 stop brighter/);
    expect(check.message).toMatch(/reshoot/);
  });
});

describe('setting changes and plan mismatch', () => {
  it('flags the frame where f-number, focal length or ISO changes, ignoring rational rounding', () => {
    const checks = runStackChecks({
      frames: [
        frameAt(0, { fNumber: 7.1, focalLengthMm: 100, iso: 200 }),
        frameAt(1, { fNumber: 71 / 10, focalLengthMm: 100, iso: 200 }),
        frameAt(2, { fNumber: 8, focalLengthMm: 100, iso: 200 }),
        frameAt(3, { fNumber: 8, focalLengthMm: 100, iso: 400 }),
        frameAt(4, { fNumber: 8, iso: 400 }),
      ],
    });
    expect(checks.map((c) => [c.code, c.severity, c.frameIds[0]])).toEqual([
      ['setting-change', 'problem', 'f2'],
      ['setting-change', 'warning', 'f3'],
    ]);
    expect(checks[0].message).toMatch(/from f\/7\.1 to f\/8 at frame 3/);
  });

  it('compares the count and the shooting time with the linked plan', () => {
    const frames = Array.from({ length: 10 }, (_, i) => frameAt(i, { captureTimeMs: i * 20_000 }));
    const checks = runStackChecks({ frames, plan: { frames: 12, stableSeconds: 150 } });
    expect(checks.map((c) => [c.code, c.severity])).toEqual([
      ['plan-mismatch', 'warning'],
      ['plan-mismatch', 'warning'],
    ]);
    const late = checks.find((c) => c.frameIds.length > 0);
    // frames shot more than 150 s after the first: 160 s and 180 s
    expect(late?.frameIds).toEqual(['f8', 'f9']);
    expect(late?.message).toMatch(/took 3 min 0 s, longer than the subject's stable time of 2 min 30 s/);
    expect(runStackChecks({ frames, plan: { frames: 11 }, thresholds: { planFrameTolerance: 1 } })).toEqual([]);
    expect(runStackChecks({ frames, plan: { frames: 8 } })[0].severity).toBe('info');
  });
});

describe('bad input', () => {
  it('names each bad field', () => {
    expect(() =>
      runStackChecks({ frames: [frameAt(0, { meanLuminance: 3 }), { frameId: '', index: -1 }], thresholds: { exposureJumpStops: -1 } }),
    ).toThrow(/frames\.0\.meanLuminance.*frames\.1\.frameId.*frames\.1\.index.*thresholds\.exposureJumpStops/);
  });

  it('rejects a sharpness grid of the wrong size', () => {
    expect(() => runStackChecks({ frames: [frameAt(0, { sharpnessGrid: [1, 2, 3] })] })).toThrow(/frames\.0\.sharpnessGrid/);
  });

  it('runs with no statistics at all', () => {
    expect(runStackChecks({ frames: [frameAt(0), frameAt(1), frameAt(2)] })).toEqual([]);
  });
});

describe('thresholds and glyphs', () => {
  it('fills a studio’s partial thresholds from the defaults and rejects unknown keys', () => {
    expect(checkThresholdsSchema.parse({ focusGapStepRatio: 2 })).toEqual({ ...defaultCheckThresholds, focusGapStepRatio: 2 });
    expect(checkThresholdsSchema.safeParse({ exposureJumpStop: 1 }).success).toBe(false);
  });

  it('gives every check its own shape, in its PRODUCT.md "Look" colour', () => {
    // colours and shapes from the Look table of PRODUCT.md
    expect(Object.keys(CHECK_GLYPHS).sort()).toEqual([...checkCodeSchema.options].sort());
    expect(CHECK_GLYPHS['exposure-jump']).toMatchObject({ colourHex: '#B7791F', shape: 'half-filled-circle' });
    expect(CHECK_GLYPHS['focus-gap']).toMatchObject({ colourHex: '#7B3F73', shape: 'broken-bracket' });
    expect(CHECK_GLYPHS['duplicate-frame']).toMatchObject({ colourHex: '#4A6FA5', shape: 'two-stacked-bars' });
    expect(CHECK_GLYPHS['plan-mismatch']).toMatchObject({ colourHex: '#A4452C', shape: 'hollow-triangle' });
    const shapes = Object.values(CHECK_GLYPHS).map((glyph) => glyph.shape);
    expect(new Set(shapes).size).toBe(shapes.length);
    for (const glyph of Object.values(CHECK_GLYPHS)) {
      for (const { d } of glyph.paths) expect(d).toMatch(/^M[\d.\sMLHVAZ]+$/);
    }
  });
});

// Rendered stacks: 16 frames of 320 x 213 px keep each stack under a second on two cores.
const STACK = { widthPx: 320, heightPx: 213, frameCount: 16 } as const;

async function checksOnRendered(options: RenderStackOptions): Promise<StackCheck[]> {
  const { files } = await renderStack({ ...STACK, ...options });
  const stats = await Promise.all(files.map((file) => computeFrameStats(file.buffer)));
  return runStackChecks({
    frames: stats.map((s, index) => ({ frameId: `f${index}`, index, meanLuminance: s.meanLuminance, sharpnessGrid: s.sharpnessGrid, fNumber: 8, iso: 200 })),
  });
}

describe('checks on rendered stacks find exactly the injected faults', () => {
  it.each([
    ['drop-on-leaf', 31],
    ['beetle', 32],
  ] as const)('a clean %s stack (seed %d) raises nothing', async (scene, seed) => {
    expect(summary(await checksOnRendered({ scene, seed }))).toEqual([]);
  });

  it.each<[string, StackFaults, string[]]>([
    ['a lamp bumped for one frame', { exposureJumpAt: 9 }, ['exposure-jump:f9']],
    ['a lamp moved and left', { exposureJumpAt: 5, exposureStops: -0.7, exposureJumpPersists: true }, ['exposure-jump:f5']],
    ['a repeated frame', { repeatAt: 7 }, ['duplicate-frame:f7,f8']],
    ['a skipped step', { skipStepAt: 6 }, ['focus-gap:f6,f7']],
    ['all three at once', { exposureJumpAt: 3, repeatAt: 7, skipStepAt: 11 }, ['exposure-jump:f3', 'duplicate-frame:f7,f8', 'focus-gap:f11,f12']],
  ])('%s', async (_, faults, expected) => {
    const checks = await checksOnRendered({ scene: 'drop-on-leaf', seed: 33, faults });
    expect(summary(checks)).toEqual(expected);
    const gap = checks.find((c) => c.code === 'focus-gap');
    if (gap) {
      expect(gap.severity).toBe('problem');
      expect(gap.region?.cells.length).toBeGreaterThan(0);
      expect(gap.message).toMatch(/Between frames \d+ and \d+ the focus moved about [\d.]+ times the stack's usual step/);
    }
  });
});

describe('focus-gap verdicts over random scenes', () => {
  // Ten scenes; each is rendered clean and with one step skipped somewhere in its middle 60 %,
  // where the subject has depth to lose (see shared/focus-checks.ts for the limits).
  const random = createRandom(20260514);
  const cases = Array.from({ length: 10 }, (_, i) => {
    const seed = 1000 + Math.floor(random() * 9000);
    const first = Math.round(STACK.frameCount * 0.2);
    const last = Math.round(STACK.frameCount * 0.8) - 1;
    return { scene: `scene ${i + 1}`, seed, skipStepAt: first + Math.floor(random() * (last - first + 1)) };
  });

  it.each(cases)('$scene (seed $seed): gap after frame index $skipStepAt found, clean stack passes', async ({ seed, skipStepAt }) => {
    const [clean, skipped] = await Promise.all([checksOnRendered({ seed }), checksOnRendered({ seed, faults: { skipStepAt } })]);
    expect(summary(clean)).toEqual([]);
    expect(summary(skipped)).toEqual([`focus-gap:f${skipStepAt},f${skipStepAt + 1}`]);
  });
});

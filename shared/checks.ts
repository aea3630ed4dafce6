import {
  checkThresholdsSchema,
  stackChecksInputSchema,
  type CheckCode,
  type CheckThresholds,
  type LinkedPlan,
  type StackCheck,
  type StackCheckFrame,
  type StackChecksInput,
} from './schemas/checks';
import { findFocusProblems } from './focus-checks';

export { CHECK_GLYPHS, type CheckGlyph } from './check-glyphs';

export const defaultCheckThresholds: CheckThresholds = checkThresholdsSchema.parse({});

/** sRGB decoding to linear light (IEC 61966-2-1:1999, section 5.2). */
export function srgbToLinear(encoded: number): number {
  return encoded <= 0.04045 ? encoded / 12.92 : ((encoded + 0.055) / 1.055) ** 2.4;
}

/** Smallest linear light counted, so a black frame reads about -20 stops, not -Infinity. */
const LINEAR_FLOOR = 1e-6;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/**
 * Exposure of each frame relative to the stack's median, in stops. The mean luminances are
 * gamma-encoded (as measured), so they are linearised first: +1 stop doubles linear light,
 * not the encoded value.
 */
export function relativeStops(meanLuminances: number[]): number[] {
  if (meanLuminances.length === 0) return [];
  meanLuminances.forEach((value, i) => {
    if (!Number.isFinite(value) || value < 0 || value > 1) {
      throw new RangeError(`meanLuminances[${i}] is ${value}; a mean luminance must be between 0 and 1`);
    }
  });
  const linear = meanLuminances.map((value) => Math.max(LINEAR_FLOOR, srgbToLinear(value)));
  const reference = median(linear);
  return linear.map((value) => Math.log2(value / reference));
}

const frameNumber = (frame: StackCheckFrame) => frame.index + 1;
const formatStops = (stops: number) => `${Math.abs(stops).toFixed(1)} stop${Math.abs(stops) >= 0.95 && Math.abs(stops) < 1.05 ? '' : 's'}`;

function exposureJumps(frames: StackCheckFrame[], thresholds: CheckThresholds): StackCheck[] {
  const measured = frames.filter((frame) => frame.meanLuminance !== undefined);
  if (measured.length < 2) return [];
  const stops = relativeStops(measured.map((frame) => frame.meanLuminance as number));
  const limit = thresholds.exposureJumpStops;
  const checks: StackCheck[] = [];
  let returningFromOutlier = false;
  for (let i = 0; i < measured.length; i++) {
    const fromPrevious = i > 0 ? stops[i] - stops[i - 1] : 0;
    const fromNext = i < measured.length - 1 ? stops[i] - stops[i + 1] : 0;
    const frame = measured[i];
    if (returningFromOutlier) {
      returningFromOutlier = false;
      continue;
    }
    const outlier = i > 0 && i < measured.length - 1 && Math.abs(fromPrevious) > limit && Math.abs(fromNext) > limit && Math.sign(fromPrevious) === Math.sign(fromNext);
    const firstFrameOff = i === 0 && Math.abs(fromNext) > limit && (measured.length < 3 || Math.abs(stops[1] - stops[2]) <= limit);
    if (outlier || firstFrameOff) {
      const offBy = outlier ? (fromPrevious + fromNext) / 2 : fromNext;
      const direction = offBy > 0 ? 'brighter' : 'darker';
      checks.push({
        code: 'exposure-jump',
        severity: 'warning',
        frameIds: [frame.frameId],
        message:
          `Frame ${frameNumber(frame)} is ${formatStops(offBy)} ${direction} than the frames beside it — usually a lamp or reflector ` +
          `that moved, or a flash that misfired. The merge may show a band at that depth: reshoot that frame at the same focus, ` +
          `or match its exposure to its neighbours before merging.`,
      });
      returningFromOutlier = true;
    } else if (i > 0 && Math.abs(fromPrevious) > limit) {
      const direction = fromPrevious > 0 ? 'brighter' : 'darker';
      checks.push({
        code: 'exposure-jump',
        severity: 'warning',
        frameIds: [frame.frameId],
        message:
          `From frame ${frameNumber(frame)} on, the frames are ${formatStops(fromPrevious)} ${direction} than before — the light ` +
          `changed mid-stack (a lamp moved or was switched). Even out the exposure of the later frames before merging, ` +
          `or reshoot the stack with the light fixed in place.`,
      });
    }
  }
  return checks;
}

function withinTolerance(a: number, b: number): boolean {
  // EXIF stores these as rationals; 1 % absorbs rounding such as 7.1 vs 71/10
  return Math.abs(a - b) <= 0.01 * Math.max(Math.abs(a), Math.abs(b));
}

const SETTINGS = [
  { key: 'fNumber', name: 'aperture', show: (v: number) => `f/${v}`, severity: 'problem', why: 'depth of field and sharpness change from that frame, so the merge may show a seam' },
  { key: 'focalLengthMm', name: 'focal length', show: (v: number) => `${v} mm`, severity: 'problem', why: 'magnification changes from that frame, so the frames will not line up cleanly' },
  { key: 'iso', name: 'ISO', show: (v: number) => `ISO ${v}`, severity: 'warning', why: 'noise and brightness change from that frame' },
] as const;

function settingChanges(frames: StackCheckFrame[]): StackCheck[] {
  const checks: StackCheck[] = [];
  for (const setting of SETTINGS) {
    let previous: StackCheckFrame | undefined;
    for (const frame of frames) {
      const value = frame[setting.key];
      if (value === undefined) continue;
      const before = previous?.[setting.key];
      if (previous && before !== undefined && !withinTolerance(before, value)) {
        checks.push({
          code: 'setting-change',
          severity: setting.severity,
          frameIds: [frame.frameId],
          message:
            `The ${setting.name} changes from ${setting.show(before)} to ${setting.show(value)} at frame ${frameNumber(frame)}: ` +
            `${setting.why}. If it was not meant, reshoot from frame ${frameNumber(frame)} with the first setting, or split the stack there.`,
        });
      }
      previous = frame;
    }
  }
  return checks;
}

function formatDuration(seconds: number): string {
  const whole = Math.round(seconds);
  return whole < 60 ? `${whole} s` : `${Math.floor(whole / 60)} min ${whole % 60} s`;
}

function planMismatches(frames: StackCheckFrame[], plan: LinkedPlan | undefined, thresholds: CheckThresholds): StackCheck[] {
  if (!plan) return [];
  const checks: StackCheck[] = [];
  const difference = frames.length - plan.frames;
  if (Math.abs(difference) > thresholds.planFrameTolerance) {
    checks.push({
      code: 'plan-mismatch',
      severity: difference < 0 ? 'warning' : 'info',
      frameIds: [],
      message:
        difference < 0
          ? `The stack has ${frames.length} frames; the linked plan asks for ${plan.frames}. Part of the depth may be missing: check the nearest and farthest frames, and shoot the missing ones if the subject is still set up.`
          : `The stack has ${frames.length} frames; the linked plan asks for ${plan.frames}. Extra frames do no harm; check that the stack holds no test shots or repeats.`,
    });
  }
  const times = frames.map((frame) => frame.captureTimeMs);
  if (plan.stableSeconds !== undefined && times.length > 1 && times.every((time) => time !== undefined)) {
    const startMs = times[0] as number;
    const spanS = ((times[times.length - 1] as number) - startMs) / 1000;
    if (spanS > plan.stableSeconds) {
      const late = frames.filter((frame) => (frame.captureTimeMs as number) - startMs > plan.stableSeconds! * 1000);
      checks.push({
        code: 'plan-mismatch',
        severity: 'warning',
        frameIds: late.map((frame) => frame.frameId),
        message:
          `The stack took ${formatDuration(spanS)}, longer than the subject's stable time of ${formatDuration(plan.stableSeconds)}. ` +
          `Frames from ${frameNumber(late[0])} on were shot after it: look for a subject that shrank, wilted or moved, and shoot faster (fewer frames, a larger step) next time.`,
      });
    }
  }
  return checks;
}

/** Runs every check on one stack. Throws a RangeError naming each bad field. */
export function runStackChecks(input: StackChecksInput): StackCheck[] {
  const parsed = stackChecksInputSchema.safeParse(input);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((issue) => `${issue.path.join('.') || 'input'}: ${issue.message}`);
    throw new RangeError(`Cannot check the stack: ${problems.join('; ')}`);
  }
  const thresholds = checkThresholdsSchema.parse(parsed.data.thresholds ?? {});
  const frames = [...parsed.data.frames].sort((a, b) => a.index - b.index);
  const stops = new Map<string, number>();
  const measured = frames.filter((frame) => frame.meanLuminance !== undefined);
  relativeStops(measured.map((frame) => frame.meanLuminance as number)).forEach((value, i) => stops.set(measured[i].frameId, value));
  const checks = [
    ...exposureJumps(frames, thresholds),
    ...findFocusProblems(frames, stops, thresholds),
    ...settingChanges(frames),
    ...planMismatches(frames, parsed.data.plan, thresholds),
  ];
  const order = new Map(frames.map((frame, i) => [frame.frameId, i]));
  const firstFrame = (check: StackCheck) => (check.frameIds.length ? (order.get(check.frameIds[0]) ?? 0) : -1);
  return checks.sort((a, b) => firstFrame(a) - firstFrame(b) || codeOrder(a.code) - codeOrder(b.code));
}

function codeOrder(code: CheckCode): number {
  return ['plan-mismatch', 'setting-change', 'exposure-jump', 'focus-gap', 'duplicate-frame'].indexOf(code);
}

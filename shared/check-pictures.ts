// The numbers behind the stack-check pictures (exposure strip, focus map), the frame marks and the
// one-line summary, from the checks' own input and output. Pure.
import { relativeStops } from './checks';
import type { CheckCode, CheckThresholds, StackCheck, StackCheckFrame } from './schemas/checks';
import type { CheckedFrame, FocusMap, NumberedCheck } from './schemas/check-views';

const GRID_COLS = 8;
const GRID_ROWS = 6;
// As in shared/focus-checks.ts: the floor under a cell's score and the brightness correction.
const LOG_FLOOR = 1e-3;

/** A checked frame; `index` is its 0-based place on the stack page, so its number is index + 1. */
export type NumberedFrame = StackCheckFrame;

/** Each frame's exposure against the stack's median, in stops (null where not measured). */
export function exposureStrip(frames: NumberedFrame[]): CheckedFrame[] {
  const measured = frames.filter((f) => f.meanLuminance !== undefined);
  const stops = new Map<string, number>();
  relativeStops(measured.map((f) => f.meanLuminance as number)).forEach((value, i) => stops.set(measured[i].frameId, value));
  return frames.map((f) => ({ frameId: f.frameId, number: f.index + 1, meanLuminance: f.meanLuminance ?? null, stops: stops.get(f.frameId) ?? null }));
}

/**
 * Which frame is sharpest in each cell of the 8 x 6 grid. A cell whose score varies less than
 * the studio's minimum contrast over the stack holds no detail to focus on and maps to null.
 * Scores are corrected for brightness the way the focus checks do, so an exposure jump does not
 * pass for focus.
 */
export function focusMapOf(frames: NumberedFrame[], thresholds: Pick<CheckThresholds, 'focusCellMinContrast'>): FocusMap | null {
  const graded = frames.filter((f) => f.sharpnessGrid !== undefined);
  if (graded.length < 3) return null;
  const minContrastLog = Math.log(thresholds.focusCellMinContrast);
  const sharpestFrameNumbers = Array.from({ length: GRID_COLS * GRID_ROWS }, (_, cell) => {
    const raw = graded.map((f) => Math.log((f.sharpnessGrid as number[])[cell] + LOG_FLOOR));
    if (Math.max(...raw) - Math.min(...raw) < minContrastLog) return null;
    let best = 0;
    let bestScore = -Infinity;
    graded.forEach((f, i) => {
      const brightness = f.meanLuminance !== undefined && f.meanLuminance > 0 ? 2 * Math.log(f.meanLuminance) : 0;
      const score = raw[i] - brightness;
      if (score > bestScore) {
        bestScore = score;
        best = i;
      }
    });
    return graded[best].index + 1;
  });
  return { gridCols: GRID_COLS, gridRows: GRID_ROWS, sharpestFrameNumbers };
}

/** The checks with the page numbers of their frames. */
export function numberChecks(checks: StackCheck[], frames: NumberedFrame[]): NumberedCheck[] {
  const numberOf = new Map(frames.map((f) => [f.frameId, f.index + 1]));
  return checks.map((c) => ({ ...c, frameNumbers: c.frameIds.map((id) => numberOf.get(id)).filter((n): n is number => n !== undefined) }));
}

/** frameId → the codes of the checks that name it, each once, in check order. */
export function codesByFrameId(checks: Pick<StackCheck, 'code' | 'frameIds'>[]): Map<string, CheckCode[]> {
  const codes = new Map<string, CheckCode[]>();
  for (const check of checks) {
    for (const id of check.frameIds) {
      const own = codes.get(id) ?? [];
      if (!own.includes(check.code)) codes.set(id, [...own, check.code]);
    }
  }
  return codes;
}

const and = (numbers: number[]) => (numbers.length <= 1 ? String(numbers[0] ?? '') : `${numbers.slice(0, -1).join(', ')} and ${numbers[numbers.length - 1]}`);

/** A few words for one check, as in "focus gap between frames 11 and 12". */
export function checkHeadline(check: Pick<NumberedCheck, 'code' | 'frameNumbers'>): string {
  const n = check.frameNumbers;
  switch (check.code) {
    case 'exposure-jump':
      return `exposure jump at frame ${n[0]}`;
    case 'focus-gap':
      return `focus gap between frames ${and(n)}`;
    case 'duplicate-frame':
      return `frames ${and(n)} duplicate each other`;
    case 'setting-change':
      return `setting change at frame ${n[0]}`;
    case 'plan-mismatch':
      return n.length ? `shot past the subject's stable time from frame ${n[0]}` : 'frame count differs from the linked plan';
  }
}

/** "2 problems: exposure jump at frame 7, focus gap between frames 11 and 12", or that all is well. */
export function summariseChecks(checks: Pick<NumberedCheck, 'code' | 'frameNumbers'>[]): string {
  if (checks.length === 0) return 'No problems found: even exposure, no focus gaps, no duplicate frames, steady settings.';
  return `${checks.length} problem${checks.length === 1 ? '' : 's'}: ${checks.map(checkHeadline).join(', ')}.`;
}

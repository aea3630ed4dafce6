import type { CheckRegion, CheckThresholds, StackCheck, StackCheckFrame } from './schemas/checks';

/*
 * Focus gaps and duplicate frames, from each frame's 8 x 6 grid of sharpness scores.
 *
 * A cell's log-sharpness traces a peaked curve over the stack as the focus passes its depth.
 * Between consecutive frames k and k+1 the "focus travel" D(k) is the mean, over cells that
 * show a focus signal at all, of |log S(k+1) - log S(k)|. Every cell's change grows with the
 * focus move, and logarithms cancel each cell's own texture contrast.
 *   - A repeated frame (focus did not move) changes only by noise: D(k) is a small fraction
 *     of the stack's median D.
 *   - A skipped step moves the focus twice as far: D(k) is about twice the D of the pairs on
 *     either side. D drifts along a stack as more or less of the subject lies near the focus,
 *     so the reference is local (the nearest non-duplicate pair on each side), not global.
 * A gap is reported only where the pair shows real change (at least half the median D), so
 * the blur-only ends of a stack, where nothing is near focus, do not raise false alarms; and
 * pairs across an exposure jump are skipped (that check reports them). The region is the cells
 * whose sharpest frame is one of the pair: the depth that fell into the gap.
 * Limits: a missed step where no part of the subject lies is invisible here (and harmless); a
 * subject whose depth bunches up in a few cells (a small, flat-topped specimen) makes D uneven
 * and can hide a gap; a stack whose every step is too large looks uniform.
 */

const LOG_FLOOR = 1e-3;
const GRID_COLS = 8;
const GRID_ROWS = 6;

interface FocusSeries {
  frames: StackCheckFrame[];
  /** log-sharpness per frame, informative cells only */
  logSharpness: number[][];
  cells: number[];
  travel: number[];
}

function focusSeries(frames: StackCheckFrame[], thresholds: CheckThresholds): FocusSeries | undefined {
  const graded = frames.filter((frame) => frame.sharpnessGrid !== undefined);
  if (graded.length < 3) return undefined;
  const grids = graded.map((frame) => frame.sharpnessGrid as number[]);
  const minContrastLog = Math.log(thresholds.focusCellMinContrast);
  const cells: number[] = [];
  for (let cell = 0; cell < grids[0].length; cell++) {
    const logs = grids.map((grid) => Math.log(grid[cell] + LOG_FLOOR));
    if (Math.max(...logs) - Math.min(...logs) >= minContrastLog) cells.push(cell);
  }
  if (cells.length < 3) return undefined;
  // A brighter frame has proportionally larger gamma-encoded differences, so its Laplacian
  // variance grows with the square of its mean luminance; dividing that out keeps an exposure
  // jump from passing for a focus move.
  const logSharpness = graded.map((frame, i) => {
    const brightness = frame.meanLuminance !== undefined && frame.meanLuminance > 0 ? 2 * Math.log(frame.meanLuminance) : 0;
    return cells.map((cell) => Math.log(grids[i][cell] + LOG_FLOOR) - brightness);
  });
  const travel = logSharpness.slice(1).map((after, k) => {
    const before = logSharpness[k];
    return after.reduce((sum, value, i) => sum + Math.abs(value - before[i]), 0) / cells.length;
  });
  return { frames: graded, logSharpness, cells, travel };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = sorted.length >> 1;
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/** Cells whose sharpest frame is one of the pair: the depth that fell into the gap. */
function gapRegion(series: FocusSeries, k: number): CheckRegion {
  const { logSharpness, cells } = series;
  const region: number[] = [];
  cells.forEach((cell, i) => {
    let best = 0;
    for (let frame = 1; frame < logSharpness.length; frame++) {
      if (logSharpness[frame][i] > logSharpness[best][i]) best = frame;
    }
    if (best === k || best === k + 1) region.push(cell);
  });
  if (region.length === 0) {
    // nothing peaks there: mark the cells that changed most across the pair
    const changes = cells.map((cell, i) => ({ cell, change: Math.abs(logSharpness[k + 1][i] - logSharpness[k][i]) }));
    const cut = median(changes.map((c) => c.change));
    for (const { cell, change } of changes) if (change > cut) region.push(cell);
  }
  return { gridCols: GRID_COLS, gridRows: GRID_ROWS, cells: region.sort((a, b) => a - b) };
}

export function describeRegion(region: CheckRegion): string {
  const rows = region.cells.map((cell) => Math.floor(cell / region.gridCols));
  const cols = region.cells.map((cell) => cell % region.gridCols);
  const horizontal = (value: number) => (value < region.gridCols / 3 ? 'left' : value < (2 * region.gridCols) / 3 ? 'middle' : 'right');
  const vertical = (value: number) => (value < region.gridRows / 3 ? 'top' : value < (2 * region.gridRows) / 3 ? 'middle' : 'bottom');
  const across = [...new Set(cols.map(horizontal))];
  const down = [...new Set(rows.map(vertical))];
  if (across.length === 3 && down.length === 3) return 'across most of the frame';
  const part = (names: string[], all: string) => (names.length === 3 ? all : names.join(' and '));
  return `in the ${part(down, 'full height')} ${part(across, 'full width')} of the frame`.replace('middle middle', 'centre');
}

/** Index of the nearest usable pair on one side, or -1. */
function nearestRealPair(k: number, step: -1 | 1, unusable: boolean[]): number {
  for (let j = k + step; j >= 0 && j < unusable.length; j += step) if (!unusable[j]) return j;
  return -1;
}

export function findFocusProblems(frames: StackCheckFrame[], stopsById: Map<string, number>, thresholds: CheckThresholds): StackCheck[] {
  const series = focusSeries(frames, thresholds);
  if (!series) return [];
  const { travel } = series;
  const usualTravel = median(travel);
  if (!(usualTravel > 0)) return [];
  const checks: StackCheck[] = [];
  const stopsApart = travel.map((_, k) => {
    const a = stopsById.get(series.frames[k].frameId);
    const b = stopsById.get(series.frames[k + 1].frameId);
    return a === undefined || b === undefined ? 0 : Math.abs(a - b);
  });
  const isDuplicate = travel.map((value, k) => value < thresholds.duplicateChangeRatio * usualTravel && stopsApart[k] < thresholds.duplicateMaxStops);
  // Across an exposure jump the sharpness scores move for reasons other than focus: such a pair
  // is neither judged nor used as a reference (the exposure-jump check reports it).
  const isLightChange = stopsApart.map((stops) => stops > thresholds.exposureJumpStops);
  const unusable = travel.map((_, k) => isDuplicate[k] || isLightChange[k]);
  travel.forEach((value, k) => {
    const first = series.frames[k];
    const second = series.frames[k + 1];
    const pair = [first.frameId, second.frameId];
    const numbers = `frames ${first.index + 1} and ${second.index + 1}`;
    if (isDuplicate[k]) {
      checks.push({
        code: 'duplicate-frame',
        severity: 'info',
        frameIds: pair,
        message:
          `${capitalise(numbers)} are nearly identical: the focus did not move between them (a double press, or the rail did not step). ` +
          `Keep one of the two; the merge does not need both.`,
      });
      return;
    }
    if (isLightChange[k]) return;
    const sides = [nearestRealPair(k, -1, unusable), nearestRealPair(k, 1, unusable)].filter((j) => j >= 0);
    if (sides.length === 0 || value < 0.5 * usualTravel) return;
    const localTravel = sides.reduce((sum, j) => sum + travel[j], 0) / sides.length;
    const ratio = value / localTravel;
    if (ratio <= thresholds.focusGapStepRatio) return;
    const region = gapRegion(series, k);
    checks.push({
      code: 'focus-gap',
      severity: 'problem',
      frameIds: pair,
      region,
      message:
        `Between ${numbers} the focus moved about ${ratio.toFixed(1)} times the stack's usual step — a step was probably missed. ` +
        `Detail at that depth (${describeRegion(region)}) may not be sharp in any frame. Shoot one more frame focused between ` +
        `${numbers} if the subject is still set up, or reshoot the stack.`,
    });
  });
  return checks;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

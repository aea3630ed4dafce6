// Sorting a card's frames into stacks and loose frames (RAW + picture pairs: raw-pairing.ts).
// Pure: the caller reads metadata and stores the result; nothing here drops a frame.
import { fileNumberOf } from './file-names';

export interface GroupingFrame {
  id: string;
  fileName: string;
  /** Absolute time (offsets applied upstream); null when the file has no capture time. */
  captureTimeMs: number | null;
  bodySerial?: string | null;
  fNumber?: number | null;
  focalLengthMm?: number | null;
  exposureTimeS?: number | null;
  iso?: number | null;
  orientation?: number | null;
}

export interface GroupingOptions {
  /** A gap splits when it is larger than gapFactor × the median of the burst's recent gaps… */
  gapFactor?: number;
  /** …and larger than this floor. */
  minGapS?: number;
  /** A gap larger than this always splits (Infinity turns it off). */
  maxGapS?: number;
  /** Runs shorter than this are loose frames. */
  minStackSize?: number;
}

/*
 * Defaults (common practice of the trade, not a published source):
 * - hand-focused stacks are shot at irregular 5–20 s intervals and different stacks minutes
 *   apart, so 4 × the median interval (20–80 s) holds a stack together and still splits at the
 *   next subject; 4 also covers the 4:1 spread between the quickest and slowest hand interval;
 * - automatic bracketing bursts are fractions of a second apart, where 4 × median is well under a
 *   second: the 3 s floor keeps a short hesitation inside one burst from splitting it;
 * - no stack is shot with frames two minutes apart, and test shots taken minutes apart must not
 *   chain into a "stack" of their own median, hence the 120 s ceiling.
 */
export const DEFAULT_GROUPING_OPTIONS: Required<GroupingOptions> = {
  gapFactor: 4,
  minGapS: 3,
  maxGapS: 120,
  minStackSize: 3,
};
/** How many of the burst's latest gaps make its pace. */
export const RECENT_GAP_COUNT = 6;
// With fewer gaps than this behind it (a burst's first frames), the following gaps fill in:
// the floor alone would cut every hand-focused stack after its first 5–20 s interval.
const MIN_OWN_GAPS = 2;
// EXIF rationals of one setting can round differently (56/10 vs 28/5); a third of a stop is 12 %.
const SETTING_TOLERANCE = 0.01;

export type StackStartReason = 'first' | 'gap' | 'setting' | 'body';
/** no-capture-time: placed by file number, or not placed at all (then also not-placed, loose). */
export type GroupingFlagCode = 'no-capture-time' | 'not-placed' | 'exposure-change';

export interface GroupedStack {
  frameIds: string[];
  /** 'first' opens the card, 'body' opens another body's frames, 'gap'/'setting' split a run. */
  startReason: StackStartReason;
  bodySerial: string | null;
}

export interface GroupingFlag {
  frameId: string;
  code: GroupingFlagCode;
}

export interface GroupingResult {
  stacks: GroupedStack[];
  loose: string[];
  flags: GroupingFlag[];
}

interface Entry {
  frame: GroupingFrame;
  inputIndex: number;
  fileNumber: number | null;
  timeMs: number | null;
  /** Own time, else the neighbour's it was placed beside; orders output across bodies. */
  sortTimeMs: number;
}

interface Run {
  entries: Entry[];
  startReason: StackStartReason;
}

function resolveOptions(options: GroupingOptions): Required<GroupingOptions> {
  const resolved = { ...DEFAULT_GROUPING_OPTIONS };
  for (const key of Object.keys(resolved) as (keyof GroupingOptions)[]) {
    if (options[key] !== undefined) resolved[key] = options[key];
  }
  const { gapFactor, minGapS, maxGapS, minStackSize } = resolved;
  if (!Number.isFinite(gapFactor) || gapFactor < 1) throw new RangeError(`gapFactor must be a number of at least 1, got ${gapFactor}`);
  if (!Number.isFinite(minGapS) || minGapS < 0) throw new RangeError(`minGapS must be a number of seconds ≥ 0, got ${minGapS}`);
  if (Number.isNaN(maxGapS) || maxGapS < minGapS) throw new RangeError(`maxGapS must be at least minGapS (${minGapS} s), got ${maxGapS}`);
  if (!Number.isInteger(minStackSize) || minStackSize < 1) throw new RangeError(`minStackSize must be a whole number ≥ 1, got ${minStackSize}`);
  return resolved;
}

function compareTimed(a: Entry, b: Entry): number {
  return (a.timeMs as number) - (b.timeMs as number) || compareByNumber(a, b);
}

function compareByNumber(a: Entry, b: Entry): number {
  const an = a.fileNumber ?? Number.POSITIVE_INFINITY;
  const bn = b.fileNumber ?? Number.POSITIVE_INFINITY;
  if (an !== bn) return an < bn ? -1 : 1;
  if (a.frame.fileName !== b.frame.fileName) return a.frame.fileName < b.frame.fileName ? -1 : 1;
  return a.inputIndex - b.inputIndex;
}

/** Orders one body's frames; frames without time go beside the frame with the next lower number. */
function orderBody(entries: Entry[]): { ordered: Entry[]; unplaced: Entry[] } {
  const timed = entries.filter((e) => e.timeMs !== null).sort(compareTimed);
  const untimed = entries.filter((e) => e.timeMs === null).sort(compareByNumber);
  const anchors = timed.map((e, position) => ({ fileNumber: e.fileNumber, position }))
    .filter((a): a is { fileNumber: number; position: number } => a.fileNumber !== null)
    .sort((a, b) => a.fileNumber - b.fileNumber || a.position - b.position);
  const after = new Map<number, Entry[]>(); // timed position (-1: before all) -> untimed frames
  const unplaced: Entry[] = [];
  for (const entry of untimed) {
    // Nothing to place it by: no number, or numbers only on frames without time.
    if (entry.fileNumber === null || (anchors.length === 0 && timed.length > 0)) {
      unplaced.push(entry);
      continue;
    }
    const position = anchorBefore(anchors, entry.fileNumber);
    const slot = after.get(position);
    if (slot) slot.push(entry);
    else after.set(position, [entry]);
  }
  const ordered: Entry[] = [...(after.get(-1) ?? [])];
  timed.forEach((entry, position) => ordered.push(entry, ...(after.get(position) ?? [])));
  inheritSortTimes(ordered);
  return { ordered, unplaced };
}

/** Timed position of the last anchor whose file number is ≤ fileNumber, -1 when none is. */
function anchorBefore(anchors: { fileNumber: number; position: number }[], fileNumber: number): number {
  let low = 0;
  let high = anchors.length; // first index with anchor number > fileNumber
  while (low < high) {
    const mid = (low + high) >>> 1;
    if (anchors[mid].fileNumber <= fileNumber) low = mid + 1;
    else high = mid;
  }
  return low === 0 ? -1 : anchors[low - 1].position;
}

function inheritSortTimes(ordered: Entry[]): void {
  let last: number | null = null;
  for (const entry of ordered) {
    if (entry.timeMs !== null) last = entry.timeMs;
    else if (last !== null) entry.sortTimeMs = last;
  }
  let next: number | null = null;
  for (let i = ordered.length - 1; i >= 0; i -= 1) {
    const entry = ordered[i];
    if (entry.timeMs !== null) next = entry.timeMs;
    else if (next !== null && entry.sortTimeMs === Number.POSITIVE_INFINITY) entry.sortTimeMs = next;
  }
}

function differs(a: number | null | undefined, b: number | null | undefined): boolean {
  if (a == null || b == null) return false; // an unknown setting is no evidence of a change
  return Math.abs(a - b) > SETTING_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
}

type Settings = Pick<GroupingFrame, 'fNumber' | 'focalLengthMm' | 'orientation' | 'exposureTimeS' | 'iso'>;
const SETTING_KEYS = ['fNumber', 'focalLengthMm', 'orientation', 'exposureTimeS', 'iso'] as const;

/** Keeps each setting's last known value, so a frame that lacks one does not hide a change. */
function remember(known: Settings, frame: GroupingFrame): void {
  for (const key of SETTING_KEYS) if (frame[key] != null) known[key] = frame[key];
}

function settingChanged(known: Settings, current: GroupingFrame): boolean {
  return differs(known.fNumber, current.fNumber)
    || differs(known.focalLengthMm, current.focalLengthMm)
    || (known.orientation != null && current.orientation != null && known.orientation !== current.orientation);
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

function splitIntoRuns(ordered: Entry[], rule: Required<GroupingOptions>, flags: GroupingFlag[]): Run[] {
  // Gaps between consecutive timed frames, frames without time being transparent.
  const gapAt = new Array<number>(ordered.length).fill(Number.NaN);
  const knownGaps: number[] = [];
  const knownGapIndexAt = new Array<number>(ordered.length).fill(-1);
  let lastTimeMs: number | null = null;
  ordered.forEach((entry, i) => {
    if (entry.timeMs === null) return;
    if (lastTimeMs !== null) {
      gapAt[i] = (entry.timeMs - lastTimeMs) / 1000;
      knownGapIndexAt[i] = knownGaps.length;
      knownGaps.push(gapAt[i]);
    }
    lastTimeMs = entry.timeMs;
  });

  const isBoundary = (gapS: number, recent: number[], knownIndex: number): boolean => {
    if (gapS <= rule.minGapS) return false;
    if (gapS > rule.maxGapS) return true;
    const pace = recent.length >= MIN_OWN_GAPS
      ? recent
      : recent.concat(knownGaps.slice(knownIndex + 1, knownIndex + 1 + RECENT_GAP_COUNT - recent.length));
    return pace.length === 0 || gapS > rule.gapFactor * median(pace);
  };

  const runs: Run[] = [];
  let run: Run = { entries: [], startReason: 'first' };
  let recent: number[] = [];
  const known: Settings = {};
  ordered.forEach((entry, i) => {
    if (i > 0) {
      const gapS = gapAt[i];
      let reason: StackStartReason | null = null;
      if (settingChanged(known, entry.frame)) reason = 'setting';
      else if (!Number.isNaN(gapS) && isBoundary(gapS, recent, knownGapIndexAt[i])) reason = 'gap';
      if (reason) {
        runs.push(run);
        run = { entries: [], startReason: reason };
        recent = [];
      } else {
        if (!Number.isNaN(gapS)) {
          recent.push(gapS);
          if (recent.length > RECENT_GAP_COUNT) recent.shift();
        }
        if (differs(known.exposureTimeS, entry.frame.exposureTimeS) || differs(known.iso, entry.frame.iso)) {
          flags.push({ frameId: entry.frame.id, code: 'exposure-change' });
        }
      }
    }
    run.entries.push(entry);
    remember(known, entry.frame);
  });
  if (run.entries.length > 0) runs.push(run);
  return runs;
}

/**
 * Groups frames into stacks per body, in capture order (file number breaks ties): a new stack
 * starts at a gap that is large for the burst it ends, or where f-number, focal length or
 * orientation changes; exposure time and ISO changes only raise an 'exposure-change' flag.
 * Every input frame appears exactly once, in a stack or among the loose frames.
 */
export function groupIntoStacks(frames: readonly GroupingFrame[], options: GroupingOptions = {}): GroupingResult {
  const rule = resolveOptions(options);
  const seen = new Set<string>();
  const bodies = new Map<string, Entry[]>();
  const flags: GroupingFlag[] = [];
  frames.forEach((frame, inputIndex) => {
    if (typeof frame.id !== 'string' || frame.id === '') throw new TypeError(`frame ${inputIndex} has no id`);
    if (seen.has(frame.id)) throw new TypeError(`frame id "${frame.id}" appears twice; each frame must be given once`);
    seen.add(frame.id);
    const timeMs = typeof frame.captureTimeMs === 'number' && Number.isFinite(frame.captureTimeMs) ? frame.captureTimeMs : null;
    if (timeMs === null) flags.push({ frameId: frame.id, code: 'no-capture-time' });
    const entry: Entry = { frame, inputIndex, fileNumber: fileNumberOf(frame.fileName), timeMs, sortTimeMs: timeMs ?? Number.POSITIVE_INFINITY };
    const body = frame.bodySerial?.trim() ?? '';
    const list = bodies.get(body);
    if (list) list.push(entry);
    else bodies.set(body, [entry]);
  });

  const looseEntries: { entry: Entry; bodyRank: number; position: number }[] = [];
  const stackRuns: { run: Run; bodyRank: number; position: number; body: string }[] = [];
  const ordered = [...bodies].map(([body, entries]) => ({ body, ...orderBody(entries) }));
  const firstTime = (o: { ordered: Entry[] }) => o.ordered[0]?.sortTimeMs ?? Number.POSITIVE_INFINITY;
  ordered.sort((a, b) => firstTime(a) - firstTime(b) || (a.body < b.body ? -1 : a.body > b.body ? 1 : 0));
  ordered.forEach(({ body, ordered: sequence, unplaced }, bodyRank) => {
    const runs = splitIntoRuns(sequence, rule, flags);
    if (runs.length > 0) runs[0].startReason = bodyRank === 0 ? 'first' : 'body';
    let position = 0;
    for (const run of runs) {
      if (run.entries.length >= rule.minStackSize) stackRuns.push({ run, bodyRank, position, body });
      else for (const entry of run.entries) looseEntries.push({ entry, bodyRank, position: position++ });
      position += 1;
    }
    for (const entry of unplaced) {
      flags.push({ frameId: entry.frame.id, code: 'not-placed' });
      looseEntries.push({ entry, bodyRank, position: position++ });
    }
  });

  stackRuns.sort((a, b) => a.run.entries[0].sortTimeMs - b.run.entries[0].sortTimeMs || a.bodyRank - b.bodyRank || a.position - b.position);
  looseEntries.sort((a, b) => a.entry.sortTimeMs - b.entry.sortTimeMs || a.bodyRank - b.bodyRank || a.position - b.position);
  return {
    stacks: stackRuns.map(({ run, body }) => ({
      frameIds: run.entries.map((e) => e.frame.id),
      startReason: run.startReason,
      bodySerial: body === '' ? null : body,
    })),
    loose: looseEntries.map((l) => l.entry.frame.id),
    flags,
  };
}

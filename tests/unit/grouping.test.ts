import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { groupIntoStacks, type GroupingFrame, type GroupingOptions } from '@shared/grouping';
import { pairRawAndJpeg, type CardFile } from '@shared/raw-pairing';
import { baseNameOf, displayNameOf, fileNumberOf, storageNameOf } from '@shared/file-names';

// The studio's scenarios: dew on a fern, a watch movement, a museum beetle.
// Shooting rhythms are common practice of the trade: hand-focused stacks at irregular 5–20 s
// intervals with minutes between stacks; automatic focus bracketing a fraction of a second apart.
const START_MS = Date.UTC(2025, 4, 17, 9, 30, 0);

interface Shot {
  /** Seconds after the previous shot of the same body (first shot: after START_MS). */
  afterS: number;
  fNumber?: number;
  focalLengthMm?: number;
  exposureTimeS?: number;
  iso?: number;
  orientation?: number;
  noTime?: boolean;
}

/** Frames "frn-0001.jpg"… with ids "<prefix>1"…, times accumulated from the intervals. */
function shoot(prefix: string, shots: Shot[], body: string | null = 'BODY-A', firstNumber = 1): GroupingFrame[] {
  let timeMs = START_MS;
  return shots.map((shot, i) => {
    timeMs += shot.afterS * 1000;
    const number = String(firstNumber + i).padStart(4, '0');
    return {
      id: `${prefix}${i + 1}`,
      fileName: `FRN_${number}.JPG`,
      captureTimeMs: shot.noTime ? null : timeMs,
      bodySerial: body,
      fNumber: shot.fNumber ?? 8,
      focalLengthMm: shot.focalLengthMm ?? 100,
      exposureTimeS: shot.exposureTimeS ?? 1 / 125,
      iso: shot.iso ?? 100,
      orientation: shot.orientation ?? 1,
    };
  });
}

const every = (intervalsS: number[], extra: Partial<Shot> = {}): Shot[] => intervalsS.map((afterS) => ({ afterS, ...extra }));
const ids = (prefix: string, from: number, to: number) => Array.from({ length: to - from + 1 }, (_, i) => `${prefix}${from + i}`);

// Irregular hand-focused intervals, 5–20 s (common practice).
const HAND = [7, 12, 5, 18, 9, 20, 6, 14, 11, 8, 16];
// Automatic bracketing, 0.2–0.4 s apart (common practice).
const BURST = [0.3, 0.25, 0.4, 0.3, 0.2, 0.35, 0.3, 0.25, 0.3, 0.4, 0.3, 0.3, 0.25, 0.3];

interface Scenario {
  name: string;
  frames: GroupingFrame[];
  options?: GroupingOptions;
  stacks: { frameIds: string[]; startReason: string }[];
  loose: string[];
}

const scenarios: Scenario[] = [
  {
    name: 'three hand-focused fern stacks, 4 and 6 minutes apart',
    frames: shoot('f', [
      ...every([0, ...HAND]), // f1–f12
      ...every([240, ...HAND.slice(0, 8)]), // f13–f21
      ...every([360, ...HAND, ...HAND.slice(0, 3)]), // f22–f36
    ]),
    stacks: [
      { frameIds: ids('f', 1, 12), startReason: 'first' },
      { frameIds: ids('f', 13, 21), startReason: 'gap' },
      { frameIds: ids('f', 22, 36), startReason: 'gap' },
    ],
    loose: [],
  },
  {
    name: 'test shot, then two bracketing bursts of the watch movement 40 s apart',
    frames: shoot('w', [
      { afterS: 0 }, // w1: the test shot
      ...every([95, ...BURST]), // w2–w16
      ...every([40, ...BURST.slice(0, 9)]), // w17–w26
    ]),
    stacks: [
      { frameIds: ids('w', 2, 16), startReason: 'gap' },
      { frameIds: ids('w', 17, 26), startReason: 'gap' },
    ],
    loose: ['w1'],
  },
  {
    name: 'a hand-focused stack whose first interval is its longest (20 s) stays whole',
    frames: shoot('b', every([0, 20, 5, 6, 5, 7, 6, 5])),
    stacks: [{ frameIds: ids('b', 1, 8), startReason: 'first' }],
    loose: [],
  },
  {
    name: 'aperture change from f/8 to f/11 mid-burst splits',
    frames: shoot('a', [...every([0, ...BURST.slice(0, 9)]), ...every(BURST.slice(0, 10), { fNumber: 11 })]),
    stacks: [
      { frameIds: ids('a', 1, 10), startReason: 'first' },
      { frameIds: ids('a', 11, 20), startReason: 'setting' },
    ],
    loose: [],
  },
  {
    name: 'focal length and orientation changes split; a two-frame run is loose',
    frames: shoot('o', [
      ...every([0, 0.3, 0.3, 0.3]),
      ...every([0.3, 0.3], { focalLengthMm: 60 }),
      ...every([0.3, 0.3, 0.3], { focalLengthMm: 60, orientation: 6 }),
    ]),
    stacks: [
      { frameIds: ids('o', 1, 4), startReason: 'first' },
      { frameIds: ids('o', 7, 9), startReason: 'setting' },
    ],
    loose: ['o5', 'o6'],
  },
  {
    name: 'a moved lamp changes exposure time and ISO but does not split the beetle stack',
    frames: shoot('l', [
      ...every([0, ...HAND.slice(0, 5)]),
      ...every(HAND.slice(5, 9), { exposureTimeS: 1 / 60 }),
      ...every(HAND.slice(0, 3), { exposureTimeS: 1 / 60, iso: 200 }),
    ]),
    stacks: [{ frameIds: ids('l', 1, 13), startReason: 'first' }],
    loose: [],
  },
  {
    name: 'midnight in local time (23:59:10+02:00 to 00:01:16+02:00) is one stack',
    frames: shoot('m', every([0, ...HAND])).map((frame) => ({
      ...frame,
      // Local wall clock 23:59:10 at UTC+2 is 21:59:10 UTC; offsets are applied upstream.
      captureTimeMs: Date.UTC(2025, 4, 17, 21, 59, 10) + (frame.captureTimeMs as number) - START_MS,
    })),
    stacks: [{ frameIds: ids('m', 1, 12), startReason: 'first' }],
    loose: [],
  },
  {
    name: 'singles minutes apart never chain into a stack of their own pace',
    frames: shoot('s', every([0, 300, 280, 310, 295])),
    stacks: [],
    loose: ids('s', 1, 5),
  },
  {
    name: 'a looser gap factor keeps two bursts 40 s apart together',
    frames: shoot('g', [...every([0, 9, 8, 10, 9]), ...every([40, 9, 8, 10])]),
    options: { gapFactor: 6 },
    stacks: [{ frameIds: ids('g', 1, 9), startReason: 'first' }],
    loose: [],
  },
];

describe('groupIntoStacks scenarios', () => {
  it.each(scenarios)('$name', ({ frames, options, stacks, loose }) => {
    const result = groupIntoStacks(frames, options);
    expect(result.stacks.map(({ frameIds, startReason }) => ({ frameIds, startReason }))).toEqual(stacks);
    expect(result.loose).toEqual(loose);
  });

  it('flags the frames where exposure changed inside a stack', () => {
    const { flags } = groupIntoStacks(scenarios[5].frames);
    expect(flags).toEqual([
      { frameId: 'l7', code: 'exposure-change' },
      { frameId: 'l11', code: 'exposure-change' },
    ]);
  });

  it('sees an aperture change past a frame that lacks the setting', () => {
    const frames = shoot('h', [...every([0, 0.3, 0.3, 0.3, 0.3]), ...every([0.3, 0.3, 0.3], { fNumber: 11 })]);
    frames[4] = { ...frames[4], fNumber: null };
    const { stacks } = groupIntoStacks(frames);
    expect(stacks.map(({ frameIds, startReason }) => ({ frameIds, startReason }))).toEqual([
      { frameIds: ids('h', 1, 5), startReason: 'first' },
      { frameIds: ids('h', 6, 8), startReason: 'setting' },
    ]);
  });

  it('gives input order no say: shuffled input groups the same', () => {
    const frames = scenarios[0].frames;
    const shuffled = [...frames].reverse();
    expect(groupIntoStacks(shuffled)).toEqual(groupIntoStacks(frames));
  });

  it('breaks equal capture times (whole-second clocks) by file number', () => {
    const frames = shoot('t', every([0, 0, 0, 1, 0, 0]));
    const { stacks } = groupIntoStacks([frames[2], frames[5], frames[0], frames[4], frames[1], frames[3]]);
    expect(stacks[0].frameIds).toEqual(ids('t', 1, 6));
  });
});

describe('two bodies on one card', () => {
  const bodyA = shoot('a', every([0, ...HAND]), 'BODY-A', 1);
  const bodyB = shoot('b', every([3, ...BURST.slice(0, 6), 30, ...BURST.slice(0, 6)]), 'BODY-B', 5001);
  const interleaved = [...bodyA, ...bodyB].sort((x, y) => (x.captureTimeMs as number) - (y.captureTimeMs as number));

  it('groups each body on its own, in time order', () => {
    const { stacks, loose } = groupIntoStacks(interleaved);
    expect(stacks).toEqual([
      { frameIds: ids('a', 1, 12), startReason: 'first', bodySerial: 'BODY-A' },
      { frameIds: ids('b', 1, 7), startReason: 'body', bodySerial: 'BODY-B' },
      { frameIds: ids('b', 8, 14), startReason: 'gap', bodySerial: 'BODY-B' },
    ]);
    expect(loose).toEqual([]);
  });
});

describe('frames without capture time', () => {
  it('places a frame by file number inside its stack and flags it', () => {
    const frames = shoot('n', every([0, ...HAND.slice(0, 9)]));
    frames[4] = { ...frames[4], captureTimeMs: null };
    const { stacks, loose, flags } = groupIntoStacks([...frames].reverse());
    expect(stacks.map((s) => s.frameIds)).toEqual([ids('n', 1, 10)]);
    expect(loose).toEqual([]);
    expect(flags).toEqual([{ frameId: 'n5', code: 'no-capture-time' }]);
  });

  it('keeps a frame with neither time nor number as a loose, flagged frame', () => {
    const frames = shoot('x', every([0, 0.3, 0.3, 0.3]));
    const stray: GroupingFrame = { id: 'stray', fileName: 'fern-dew.jpg', captureTimeMs: null, bodySerial: 'BODY-A' };
    const { stacks, loose, flags } = groupIntoStacks([stray, ...frames]);
    expect(stacks.map((s) => s.frameIds)).toEqual([ids('x', 1, 4)]);
    expect(loose).toEqual(['stray']);
    expect(flags).toEqual([
      { frameId: 'stray', code: 'no-capture-time' },
      { frameId: 'stray', code: 'not-placed' },
    ]);
  });

  it('orders a body with no capture times at all by file number', () => {
    const frames = shoot('z', every([0, 1, 1, 1, 1], { noTime: true }));
    const { stacks } = groupIntoStacks([frames[3], frames[0], frames[4], frames[2], frames[1]]);
    expect(stacks.map((s) => s.frameIds)).toEqual([ids('z', 1, 5)]);
  });

  it('places frames numbered below every timed frame before them', () => {
    const frames = shoot('p', every([0, 0.3, 0.3, 0.3]), 'BODY-A', 10);
    const early: GroupingFrame = { ...frames[0], id: 'early', fileName: 'FRN_0009.JPG', captureTimeMs: null };
    expect(groupIntoStacks([...frames, early]).stacks[0].frameIds).toEqual(['early', ...ids('p', 1, 4)]);
  });
});

describe('bad input', () => {
  const frames = shoot('q', every([0, 1, 1]));
  it.each([
    [{ gapFactor: 0 }, /gapFactor must be a number of at least 1/],
    [{ minGapS: -1 }, /minGapS must be a number of seconds ≥ 0/],
    [{ minGapS: 10, maxGapS: 5 }, /maxGapS must be at least minGapS/],
    [{ minStackSize: 2.5 }, /minStackSize must be a whole number/],
  ] as [GroupingOptions, RegExp][])('refuses options %o with a clear message', (options, message) => {
    expect(() => groupIntoStacks(frames, options)).toThrow(message);
  });
  it('refuses a frame given twice', () => {
    expect(() => groupIntoStacks([...frames, frames[1]])).toThrow('frame id "q2" appears twice');
  });
  it('treats a non-finite capture time as missing, not as a time', () => {
    const { flags, stacks } = groupIntoStacks([{ ...frames[0], captureTimeMs: Number.NaN }, frames[1], frames[2]]);
    expect(flags).toEqual([{ frameId: 'q1', code: 'no-capture-time' }]);
    expect(stacks[0].frameIds).toEqual(ids('q', 1, 3));
  });
});

describe('pairRawAndJpeg', () => {
  const file = (id: string, fileName: string, isRaw: boolean, captureTimeMs: number | null, extra: Partial<CardFile> = {}): CardFile => ({
    id, fileName, isRaw, captureTimeMs, bodySerial: 'BODY-A', fNumber: 8, exposureTimeS: 1 / 125, ...extra,
  });

  it.each([
    ['same name, case differs, 0.4 s apart', file('r', 'DCIM/frn_0042.raw', true, START_MS), file('j', 'FRN_0042.JPG', false, START_MS + 400), true],
    ['no capture time on the picture: name and body decide', file('r', 'FRN_0042.RAW', true, START_MS), file('j', 'FRN_0042.JPG', false, null), true],
    ['unknown body on one side', file('r', 'FRN_0042.RAW', true, START_MS, { bodySerial: null }), file('j', 'FRN_0042.JPG', false, START_MS), true],
    ['times 1.5 s apart (file numbers wrapped round)', file('r', 'FRN_0042.RAW', true, START_MS), file('j', 'FRN_0042.JPG', false, START_MS + 1500), false],
    ['different bodies', file('r', 'FRN_0042.RAW', true, START_MS), file('j', 'FRN_0042.JPG', false, START_MS, { bodySerial: 'BODY-B' }), false],
    ['different base names', file('r', 'FRN_0042.RAW', true, START_MS), file('j', 'FRN_0043.JPG', false, START_MS), false],
    ['two pictures, no raw', file('r', 'FRN_0042.HEIF', false, START_MS), file('j', 'FRN_0042.JPG', false, START_MS), false],
  ])('%s', (_name, a, b, paired) => {
    const frames = pairRawAndJpeg([b, a]);
    expect(frames.length).toBe(paired ? 1 : 2);
    if (paired) expect(frames[0]).toMatchObject({ id: 'r', primaryFileId: 'r', fileIds: ['r', 'j'] });
  });

  it("takes the RAW's metadata, each missing field from the picture", () => {
    const raw = file('r', 'FRN_0042.RAW', true, START_MS, { fNumber: 5.6, iso: null, orientation: undefined });
    const jpeg = file('j', 'FRN_0042.JPG', false, START_MS + 10, { fNumber: 8, iso: 400, orientation: 6 });
    expect(pairRawAndJpeg([jpeg, raw])[0]).toMatchObject({
      fileName: 'FRN_0042.RAW', captureTimeMs: START_MS, fNumber: 5.6, iso: 400, orientation: 6,
    });
  });

  it('pairs a card of RAW+JPEG exposures and groups the pairs as one stack', () => {
    const shots = shoot('e', every([0, ...HAND.slice(0, 7)]));
    const files = shots.flatMap((s): CardFile[] => [
      { ...s, id: `${s.id}-raw`, fileName: s.fileName.replace('.JPG', '.RAW'), isRaw: true },
      { ...s, id: `${s.id}-jpg`, isRaw: false },
    ]);
    const frames = pairRawAndJpeg(files);
    expect(frames.map((f) => f.fileIds)).toEqual(shots.map((s) => [`${s.id}-raw`, `${s.id}-jpg`]));
    expect(groupIntoStacks(frames).stacks.map((s) => s.frameIds)).toEqual([shots.map((s) => `${s.id}-raw`)]);
  });
});

describe('file names', () => {
  it.each([
    ['FRN_0042.JPG', 42],
    ['frame-0042.jpg', 42],
    ['DCIM\\100STUDIO\\FRN_0007.RAW', 7],
    ['frame-0042 (1).jpg', 42],
    ['fern-dew.jpg', null],
    ['0001', 1],
    ['shot.2025.jpg', 2025],
    ['x1234567890123456.jpg', null],
  ])('fileNumberOf(%s) = %s', (name, number) => {
    expect(fileNumberOf(name)).toBe(number);
  });

  it.each([
    ['DCIM/FRN_0042.JPG', 'FRN_0042'],
    ['.hidden', '.hidden'],
    ['a.b.c', 'a.b'],
  ])('baseNameOf(%s) = %s', (name, base) => expect(baseNameOf(name)).toBe(base));

  it.each([
    ['../../etc/passwd', 'passwd', 'passwd'],
    ['käfer\u202Egpj.exe', 'käfergpj.exe', 'kafergpj.exe'],
    ['  fern\tdew .JPG ', 'ferndew .JPG', 'ferndew_.JPG'],
    ['..', '..', 'unnamed'],
    ['', 'unnamed', 'unnamed'],
    ['牛.jpg', '牛.jpg', 'jpg'],
  ])('display and storage names of %j', (name, display, storage) => {
    expect(displayNameOf(name)).toBe(display);
    expect(storageNameOf(name)).toBe(storage);
  });

  it('keeps the extension when shortening a long name', () => {
    const name = storageNameOf(`${'a'.repeat(400)}.jpg`);
    expect(name.length).toBeLessThanOrEqual(200);
    expect(name.endsWith('.jpg')).toBe(true);
  });
});

describe('invariants on random cards', () => {
  const frameArb = fc.record({
    time: fc.option(fc.integer({ min: 0, max: 3_600_000 }), { freq: 6 }),
    number: fc.option(fc.integer({ min: 0, max: 9999 }), { freq: 8 }),
    body: fc.constantFrom(null, 'BODY-A', 'BODY-B'),
    fNumber: fc.option(fc.constantFrom(5.6, 8, 11)),
    orientation: fc.constantFrom(1, 1, 1, 6),
    exposureTimeS: fc.constantFrom(1 / 60, 1 / 125),
  });
  const optionsArb = fc.record({
    gapFactor: fc.double({ min: 1, max: 10, noNaN: true }),
    minGapS: fc.double({ min: 0, max: 10, noNaN: true }),
    minStackSize: fc.integer({ min: 1, max: 5 }),
  });
  const toFrames = (raw: { time: number | null; number: number | null; body: string | null; fNumber: number | null; orientation: number; exposureTimeS: number }[]) =>
    raw.map((r, i): GroupingFrame => ({
      id: `r${i}`,
      fileName: r.number === null ? `fern-${String.fromCharCode(97 + (i % 26))}.jpg` : `FRN_${r.number}.JPG`,
      captureTimeMs: r.time,
      bodySerial: r.body,
      fNumber: r.fNumber,
      orientation: r.orientation,
      exposureTimeS: r.exposureTimeS,
    }));

  it('every frame appears exactly once; stacks are one body, long enough, in time order', () => {
    fc.assert(fc.property(fc.array(frameArb, { maxLength: 120 }), optionsArb, (raw, options) => {
      const frames = toFrames(raw);
      const { stacks, loose } = groupIntoStacks(frames, options);
      const out = [...stacks.flatMap((s) => s.frameIds), ...loose];
      expect(out.sort()).toEqual(frames.map((f) => f.id).sort());
      const byId = new Map(frames.map((f) => [f.id, f]));
      for (const stack of stacks) {
        expect(stack.frameIds.length).toBeGreaterThanOrEqual(options.minStackSize);
        const members = stack.frameIds.map((id) => byId.get(id) as GroupingFrame);
        expect(new Set(members.map((f) => f.bodySerial ?? null))).toEqual(new Set([stack.bodySerial]));
        const times = members.map((f) => f.captureTimeMs).filter((t): t is number => t !== null);
        expect(times).toEqual([...times].sort((a, b) => a - b));
      }
    }), { numRuns: 200 });
  });

  it('pairing keeps every file exactly once', () => {
    const fileArb = fc.record({
      base: fc.constantFrom('FRN_0001', 'frn_0001', 'FRN_0002', 'fern'),
      isRaw: fc.boolean(),
      time: fc.option(fc.integer({ min: 0, max: 3000 })),
      body: fc.constantFrom(null, 'BODY-A', 'BODY-B'),
    });
    fc.assert(fc.property(fc.array(fileArb, { maxLength: 40 }), (raw) => {
      const files = raw.map((r, i): CardFile => ({
        id: `c${i}`, fileName: `${r.base}.${r.isRaw ? 'RAW' : 'JPG'}`, isRaw: r.isRaw, captureTimeMs: r.time, bodySerial: r.body,
      }));
      const frames = pairRawAndJpeg(files);
      expect(frames.flatMap((f) => f.fileIds).sort()).toEqual(files.map((f) => f.id).sort());
      for (const frame of frames) expect(frame.fileIds[0]).toBe(frame.primaryFileId);
    }), { numRuns: 200 });
  });
});

import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main, parseRenderStackArgs, writeRendered } from '../../scripts/render-stack';
import { focusDepthsFor, renderCard, renderStack, renderStackOptionsSchema } from '../../scripts/lib/stack-renderer';
import { renderScene } from '../../scripts/lib/stack-renderer/scene';
import { computeFrameStats } from '../../worker/lib/frame-stats';

// Reference tool: exiftool 12.57 from Debian 12 (/usr/bin/exiftool).
const EXIFTOOL = '/usr/bin/exiftool';
const SMALL = { widthPx: 240, heightPx: 160 } as const;
let workDir: string;

beforeAll(() => {
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-renderer-'));
});
afterAll(() => fs.rmSync(workDir, { recursive: true, force: true }));

function exiftool(files: { name: string; buffer: Buffer }[], ...args: string[]): Record<string, unknown>[] {
  const paths = files.map((file) => {
    const target = path.join(workDir, file.name);
    fs.writeFileSync(target, file.buffer);
    return target;
  });
  return JSON.parse(execFileSync(EXIFTOOL, ['-j', ...args, ...paths]).toString());
}

describe('capture metadata', () => {
  it('writes what a body writes, read back by exiftool from the JPEG and the raw-like TIFF', async () => {
    const { files, truth } = await renderStack({
      ...SMALL,
      seed: 3,
      frameCount: 3,
      withRaw: true,
      startTime: '2026-05-14T23:59:58.250-04:30',
      fNumber: 7.1,
      exposureTimeS: 1 / 125,
      iso: 400,
      focalLengthMm: 65,
      orientation: 8,
      bodySerial: 'LMD-777',
    });
    expect(files.map((f) => f.name)).toEqual(['FRN_0001.TIF', 'FRN_0001.JPG', 'FRN_0002.TIF', 'FRN_0002.JPG', 'FRN_0003.TIF', 'FRN_0003.JPG']);
    const tags = exiftool(files, '-n', '-ExifIFD:all', '-IFD0:Orientation', '-Composite:SubSecDateTimeOriginal', '-File:FileType');
    tags.forEach((read, i) => {
      const file = files[i];
      expect(read).toMatchObject({
        FileType: file.kind === 'jpeg' ? 'JPEG' : 'TIFF',
        ExposureTime: 1 / 125,
        FNumber: 7.1,
        ISO: 400,
        FocalLength: 65,
        Orientation: 8,
        SerialNumber: 'LMD-777',
        OffsetTimeOriginal: '-04:30',
      });
      expect(Date.parse(String(read.SubSecDateTimeOriginal).replace(/^(\d{4}):(\d{2}):(\d{2}) /, '$1-$2-$3T'))).toBe(file.captureTimeMs);
      expect(file.captureTimeMs).toBe(truth.captureTimesMs[file.frameIndex]);
    });
    // local wall-clock time crosses midnight from the UTC start: 23:59:58.250 at -04:30
    expect(tags[0].DateTimeOriginal).toBe('2026:05:14 23:59:58');
  });

  it('writes files that exiftool validates without warnings', async () => {
    const { files } = await renderStack({ ...SMALL, seed: 4, frameCount: 3, withRaw: true });
    for (const read of exiftool(files.slice(0, 2), '-validate', '-warning', '-a')) expect(read.Validate).toBe('OK');
  });

  it('gives the raw-like TIFF the same picture as its JPEG, and a reduced copy in IFD1', async () => {
    const { files } = await renderStack({ ...SMALL, seed: 5, frameCount: 3, withRaw: true });
    const [tiff, jpeg] = files;
    expect(await sharp(tiff.buffer).metadata()).toMatchObject({ format: 'tiff', width: 240, height: 160 });
    const [tiffStats, jpegStats] = await Promise.all([computeFrameStats(tiff.buffer), computeFrameStats(jpeg.buffer)]);
    expect(Math.abs(tiffStats.meanLuminance / jpegStats.meanLuminance - 1)).toBeLessThan(0.01);
    const [read] = exiftool([tiff], '-n', '-IFD1:ImageWidth', '-IFD1:SubfileType');
    expect(read).toMatchObject({ ImageWidth: 160, SubfileType: 1 });
  });

  it('spaces frames 2–6 s apart like a rail stack, in file-number order', async () => {
    const { files, truth } = await renderStack({ ...SMALL, seed: 6, frameCount: 12 });
    const gapsS = truth.captureTimesMs.slice(1).map((t, i) => (t - truth.captureTimesMs[i]) / 1000);
    for (const gap of gapsS) {
      expect(gap).toBeGreaterThanOrEqual(2);
      expect(gap).toBeLessThanOrEqual(6);
    }
    expect(files.map((f) => f.name)).toEqual([...files.map((f) => f.name)].sort());
  });

  it('wraps file numbers after 9999 as bodies do', async () => {
    const { files } = await renderStack({ ...SMALL, seed: 7, frameCount: 3, firstFileNumber: 9998 });
    expect(files.map((f) => f.name)).toEqual(['FRN_9998.JPG', 'FRN_9999.JPG', 'FRN_0001.JPG']);
  });
});

describe('rendering', () => {
  it('is deterministic for a seed and differs between seeds', async () => {
    const options = { ...SMALL, frameCount: 3 };
    const [a, b, c] = await Promise.all([renderStack({ ...options, seed: 11 }), renderStack({ ...options, seed: 11 }), renderStack({ ...options, seed: 12 })]);
    expect(a.files[1].buffer.equals(b.files[1].buffer)).toBe(true);
    expect(a.files[1].buffer.equals(c.files[1].buffer)).toBe(false);
  });

  it.each(['drop-on-leaf', 'beetle'] as const)('makes each grid cell sharpest in the frame focused nearest its depth (%s)', async (scene) => {
    const widthPx = 320;
    const heightPx = 213;
    const options = { scene, seed: 13, widthPx, heightPx, frameCount: 12, depthRangeMm: [0, 4] as [number, number] };
    const { files, truth } = await renderStack(options);
    const sceneImage = renderScene(scene, { widthPx, heightPx, seed: 13, subjectNearMm: 0, subjectFarMm: 4 });
    const stats = await Promise.all(files.map((f) => computeFrameStats(f.buffer)));
    const errorsInSteps: number[] = [];
    for (let cell = 0; cell < 48; cell++) {
      const depths: number[] = [];
      for (let y = Math.floor(((cell >> 3) * heightPx) / 6); y < Math.floor((((cell >> 3) + 1) * heightPx) / 6); y++) {
        for (let x = Math.floor(((cell % 8) * widthPx) / 8); x < Math.floor((((cell % 8) + 1) * widthPx) / 8); x++) {
          depths.push(sceneImage.depthMm[y * widthPx + x]);
        }
      }
      depths.sort((p, q) => p - q);
      const cellDepthMm = depths[depths.length >> 1];
      const spreadMm = depths[Math.floor(depths.length * 0.9)] - depths[Math.floor(depths.length * 0.1)];
      if (cellDepthMm > 4 || spreadMm > truth.stepMm) continue; // background, or a cell spanning many depths
      const sharpest = stats.reduce((best, s, i) => (s.sharpnessGrid[cell] > stats[best].sharpnessGrid[cell] ? i : best), 0);
      errorsInSteps.push(Math.abs(truth.focusDepthsMm[sharpest] - cellDepthMm) / truth.stepMm);
    }
    expect(errorsInSteps.length).toBeGreaterThanOrEqual(12);
    errorsInSteps.forEach((error) => expect(error).toBeLessThanOrEqual(1));
  });

  it('plans focus depths with the injected focus faults', () => {
    const base = { frameCount: 6, depthRangeMm: [0, 5] as [number, number] };
    const depths = (faults: object) => focusDepthsFor(renderStackOptionsSchema.parse({ ...base, faults })).focusDepthsMm;
    expect(depths({})).toEqual([0, 1, 2, 3, 4, 5]);
    expect(depths({ skipStepAt: 2 })).toEqual([0, 1, 2, 4, 5, 6]);
    expect(depths({ repeatAt: 2 })).toEqual([0, 1, 2, 2, 3, 4]);
  });

  it('applies exposure faults as a single frame or a lasting step', async () => {
    const single = await renderStack({ ...SMALL, seed: 8, frameCount: 5, exposureJitterStops: 0, faults: { exposureJumpAt: 2 } });
    const lasting = await renderStack({ ...SMALL, seed: 8, frameCount: 5, exposureJitterStops: 0, faults: { exposureJumpAt: 2, exposureStops: -0.5, exposureJumpPersists: true } });
    expect(single.truth.exposureStops).toEqual([0, 0, 1, 0, 0]);
    expect(lasting.truth.exposureStops).toEqual([0, 0, -0.5, -0.5, -0.5]);
  });
});

describe('bad options', () => {
  it.each([
    [{ frameCount: 1 }, /frameCount/],
    [{ frameCount: 5, faults: { skipStepAt: 4 } }, /skipStepAt must be a frame index from 0 to 3/],
    [{ frameCount: 5, faults: { exposureJumpAt: 9 } }, /exposureJumpAt must be a frame index from 0 to 4/],
    [{ depthRangeMm: [3, 1] }, /far end of depthRangeMm/],
    [{ startTime: '14 May 2026' }, /startTime must be ISO 8601/],
    [{ scene: 'dragon' }, /scene/],
    [{ framecount: 5 }, /framecount/],
  ])('rejects %j with a message naming the option', async (options, message) => {
    await expect(renderStack(options as never)).rejects.toThrow(message);
  });
});

describe('card', () => {
  it('lays out stacks minutes apart with loose test shots and running file numbers', async () => {
    const { files, truth } = await renderCard({
      ...SMALL,
      seed: 2,
      stacks: [
        { frameCount: 5, withRaw: true },
        { frameCount: 4, scene: 'beetle', faults: { repeatAt: 1 } },
        { frameCount: 3 },
      ],
    });
    const jpegs = files.filter((f) => f.kind === 'jpeg');
    expect(jpegs.map((f) => Number(f.name.slice(4, 8)))).toEqual(jpegs.map((_, i) => i + 1));
    for (let i = 1; i < jpegs.length; i++) expect(jpegs[i].captureTimeMs).toBeGreaterThan(jpegs[i - 1].captureTimeMs);
    expect(truth.looseFrames.length).toBeGreaterThanOrEqual(3);
    expect(truth.looseFrames.length).toBeLessThanOrEqual(6);
    expect(truth.stacks.map((s) => s.truth.faults)).toEqual([{}, { repeatAt: 1 }, {}]);
    // RAW+JPEG pairs: same base name, same capture time
    const raws = files.filter((f) => f.kind === 'raw-like');
    expect(raws).toHaveLength(5);
    for (const raw of raws) {
      const partner = files.find((f) => f.kind === 'jpeg' && f.name === raw.name.replace('.TIF', '.JPG'));
      expect(partner?.captureTimeMs).toBe(raw.captureTimeMs);
    }
    // minutes between stacks, seconds inside them, and a pause between test shots and the stack
    for (let s = 1; s < truth.stacks.length; s++) {
      const previousEnd = truth.stacks[s - 1].truth.captureTimesMs.at(-1) as number;
      expect(truth.stacks[s].truth.captureTimesMs[0] - previousEnd).toBeGreaterThan(3 * 60_000);
    }
    for (const [s, stack] of truth.stacks.entries()) {
      const firstOfStack = stack.truth.captureTimesMs[0];
      const testShot = jpegs.filter((f) => f.stackIndex === null && f.captureTimeMs < firstOfStack).at(-1);
      expect(testShot, `test shot before stack ${s}`).toBeDefined();
      expect(firstOfStack - (testShot as { captureTimeMs: number }).captureTimeMs).toBeGreaterThanOrEqual(25_000);
    }
  });

  it('rejects a third test shot, which would turn loose frames into a stack', async () => {
    await expect(renderCard({ stacks: [{ frameCount: 5, testShots: 3 }] })).rejects.toThrow(/stacks\.0\.testShots/);
  });
});

describe('command line', () => {
  it('reads options and faults', () => {
    const command = parseRenderStackArgs(['--out', 'x', '--frames', '12', '--seed', '4', '--exposure-jump-at', '3', '--skip-step-at', '6', '--raw']);
    expect(command).toMatchObject({ outDir: 'x', force: false, card: false, options: { frameCount: 12, seed: 4, withRaw: true, faults: { exposureJumpAt: 3, skipStepAt: 6 } } });
  });

  it.each([
    [['--frames', '12'], /--out DIR is required/],
    [['--out', 'x', '--frames', 'twelve'], /--frames must be a whole number, got "twelve"/],
    [['--out', 'x', '--colour', 'red'], /colour/],
  ])('explains bad arguments %j', (argv, message) => {
    expect(() => parseRenderStackArgs(argv)).toThrow(message);
  });

  it('writes frames and truth.json, and refuses to overwrite without --force, losing nothing', async () => {
    const outDir = path.join(workDir, 'cli');
    expect(await main(['--out', outDir, '--frames', '3', '--width', '96', '--height', '64', '--seed', '9'])).toBe(0);
    expect(fs.readdirSync(outDir).sort()).toEqual(['FRN_0001.JPG', 'FRN_0002.JPG', 'FRN_0003.JPG', 'truth.json']);
    const before = fs.readFileSync(path.join(outDir, 'FRN_0002.JPG'));
    await expect(writeRendered(outDir, [{ name: 'FRN_0002.JPG', buffer: Buffer.from('other') }], {}, false)).rejects.toThrow(
      /already holds FRN_0002.JPG, truth.json; nothing was written/,
    );
    expect(fs.readFileSync(path.join(outDir, 'FRN_0002.JPG')).equals(before)).toBe(true);
  });
});

import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { relativeStops, srgbToLinear } from '@shared/checks';
import { renderStack } from '../../scripts/lib/stack-renderer';
import {
  computeFrameStats,
  FrameStatsError,
  laplacianVarianceGrid,
  REC709_LUMA_WEIGHTS,
} from '../../worker/lib/frame-stats';

// Reference tool: ImageMagick 6.9.11 from Debian 12 (/usr/bin/convert).
const CONVERT = '/usr/bin/convert';
let workDir: string;

beforeAll(() => {
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-frame-stats-'));
});
afterAll(() => fs.rmSync(workDir, { recursive: true, force: true }));

function writeTemp(name: string, buffer: Buffer): string {
  const file = path.join(workDir, name);
  fs.writeFileSync(file, buffer);
  return file;
}

function imageMagick(file: string, ...operations: string[]): number {
  return Number(execFileSync(CONVERT, [file, ...operations, 'info:']).toString());
}

const imageMagickGreyMean = (file: string) => imageMagick(file, '-colorspace', 'Gray', '-format', '%[fx:mean]');

async function flatPatch(rgb: [number, number, number]): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: { r: rgb[0], g: rgb[1], b: rgb[2] } } }).png().toBuffer();
}

describe('mean luminance', () => {
  it.each([
    [[255, 0, 0]],
    [[0, 255, 0]],
    [[0, 0, 255]],
    [[128, 0, 0]],
    [[200, 100, 50]],
    [[30, 60, 90]],
  ] as [[number, number, number]][])('of a flat %j patch agrees with ImageMagick -colorspace Gray', async (rgb) => {
    const png = await flatPatch(rgb);
    const reference = imageMagickGreyMean(writeTemp(`patch-${rgb.join('-')}.png`, png));
    const { meanLuminance } = await computeFrameStats(png);
    expect(Math.abs(meanLuminance - reference)).toBeLessThanOrEqual(0.01 * reference);
  });

  it.each([
    ['drop-on-leaf', 4],
    ['beetle', 9],
  ] as const)('of rendered %s frames (seed %d) agrees with ImageMagick within 1 percent', async (scene, seed) => {
    const { files } = await renderStack({ scene, seed, widthPx: 400, heightPx: 267, frameCount: 3 });
    for (const file of files) {
      const reference = imageMagickGreyMean(writeTemp(file.name, file.buffer));
      const { meanLuminance } = await computeFrameStats(file.buffer);
      expect(Math.abs(meanLuminance / reference - 1)).toBeLessThan(0.01);
    }
  });
});

describe('exposure in stops', () => {
  it('linearises sRGB like ImageMagick -colorspace RGB', () => {
    for (const grey of [5, 50, 128, 230]) {
      const file = path.join(workDir, `grey-${grey}.png`);
      execFileSync(CONVERT, ['-size', '1x1', `xc:rgb(${grey},${grey},${grey})`, file]);
      const reference = imageMagick(file, '-colorspace', 'RGB', '-format', '%[fx:r]');
      expect(Math.abs(srgbToLinear(grey / 255) - reference)).toBeLessThan(1e-4);
    }
  });

  it.each(['drop-on-leaf', 'beetle'] as const)('measures frames rendered at 0, ±⅓ and ±1 stop within 0.1 stop (%s)', async (scene) => {
    const planned = [0, 1 / 3, -1 / 3, 1, -1];
    // a depth range far inside one step keeps every frame at the same focus: only the light changes
    const { files, truth } = await renderStack({
      scene,
      seed: 21,
      widthPx: 320,
      heightPx: 213,
      frameCount: planned.length,
      depthRangeMm: [0, 0.001],
      exposureJitterStops: 0,
      exposureStopsByFrame: planned,
    });
    const stats = await Promise.all(files.map((file) => computeFrameStats(file.buffer)));
    const measured = relativeStops(stats.map((s) => s.meanLuminance));
    const offset = measured[0] - truth.exposureStops[0];
    measured.forEach((stops, i) => expect(Math.abs(stops - offset - planned[i])).toBeLessThan(0.1));
  });
});

describe('sharpness grid', () => {
  it('uses the 4-neighbour Laplacian: its whole-frame variance agrees with ImageMagick Laplacian:1 within 2 %', async () => {
    const { files } = await renderStack({ seed: 5, widthPx: 400, heightPx: 267, frameCount: 3 });
    const file = writeTemp('laplacian.jpg', files[1].buffer);
    // scale 0.1 and a 50 % bias keep the signed result inside ImageMagick's unsigned Q16 range
    const referenceSd =
      imageMagick(file, '-colorspace', 'Gray', '-define', 'convolve:scale=0.1', '-bias', '50%', '-morphology', 'Convolve', 'Laplacian:1', '-format', '%[fx:standard_deviation]') * 10 * 255;
    const { data, info } = await sharp(files[1].buffer).raw().toBuffer({ resolveWithObject: true });
    const luma = new Float32Array(info.width * info.height);
    for (let p = 0; p < luma.length; p++) {
      luma[p] = REC709_LUMA_WEIGHTS[0] * data[3 * p] + REC709_LUMA_WEIGHTS[1] * data[3 * p + 1] + REC709_LUMA_WEIGHTS[2] * data[3 * p + 2];
    }
    const [variance] = laplacianVarianceGrid(luma, info.width, info.height, 1, 1);
    expect(Math.abs(Math.sqrt(variance) / referenceSd - 1)).toBeLessThan(0.02);
  });

  it('returns 8 x 6 cells that drop when the frame is blurred', async () => {
    const { files } = await renderStack({ seed: 6, widthPx: 320, heightPx: 213, frameCount: 3 });
    const sharpStats = await computeFrameStats(files[1].buffer);
    const blurred = await computeFrameStats(await sharp(files[1].buffer).blur(2).jpeg({ quality: 92 }).toBuffer());
    expect(sharpStats).toMatchObject({ gridCols: 8, gridRows: 6, widthPx: 320, heightPx: 213 });
    expect(sharpStats.sharpnessGrid).toHaveLength(48);
    sharpStats.sharpnessGrid.forEach((score, cell) => expect(blurred.sharpnessGrid[cell]).toBeLessThan(score));
  });

  it('measures the picture as shown: EXIF orientation 6 turns it upright', async () => {
    const { files } = await renderStack({ seed: 7, widthPx: 240, heightPx: 160, frameCount: 3, orientation: 6 });
    expect(await computeFrameStats(files[0].buffer)).toMatchObject({ widthPx: 160, heightPx: 240 });
  });

  it('shrinks previews larger than 1600 px before measuring', async () => {
    const big = await sharp({ create: { width: 2400, height: 1600, channels: 3, background: '#556677' } }).jpeg().toBuffer();
    expect(await computeFrameStats(big)).toMatchObject({ widthPx: 1600, heightPx: 1067 });
  });
});

describe('bad input', () => {
  it('rejects bytes that are not an image, naming the input', async () => {
    await expect(computeFrameStats(Buffer.from('not a picture at all'))).rejects.toThrow(/Cannot measure frame statistics of a 20-byte buffer/);
  });

  it('rejects a missing file, naming the path', async () => {
    const missing = path.join(workDir, 'no-such-preview.jpg');
    await expect(computeFrameStats(missing)).rejects.toThrow(FrameStatsError);
    await expect(computeFrameStats(missing)).rejects.toThrow(missing);
  });

  it('refuses a header that claims more than 100 megapixels, without decoding it', async () => {
    const jpeg = await sharp({ create: { width: 32, height: 32, channels: 3, background: '#808080' } }).jpeg().toBuffer();
    const forged = Buffer.from(jpeg);
    const sof = forged.indexOf(Buffer.from([0xff, 0xc0]));
    forged.writeUInt16BE(20000, sof + 5);
    forged.writeUInt16BE(20000, sof + 7);
    await expect(computeFrameStats(forged)).rejects.toThrow(/pixel limit/i);
  });

  it('rejects a picture too small for an 8 x 6 grid', async () => {
    const tiny = await sharp({ create: { width: 16, height: 12, channels: 3, background: '#808080' } }).png().toBuffer();
    await expect(computeFrameStats(tiny)).rejects.toThrow(/only 16x12 px/);
  });

  it('leaves the input file untouched', async () => {
    const { files } = await renderStack({ seed: 8, widthPx: 160, heightPx: 107, frameCount: 3 });
    const file = writeTemp('untouched.jpg', files[0].buffer);
    await computeFrameStats(file);
    expect(fs.readFileSync(file).equals(files[0].buffer)).toBe(true);
  });
});

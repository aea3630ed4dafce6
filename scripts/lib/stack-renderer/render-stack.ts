import sharp from 'sharp';
import { jpegExif, withExifVersion, type CaptureSettings } from './capture-metadata';
import { buildBlurLadder, defocusSigmas, renderDefocused } from './defocus';
import { createRandom, fillGrain, randomBetween } from './noise';
import {
  offsetMinutesOf,
  parseRenderStackOptions,
  startTimeMs,
  type RenderStackOptions,
  type ResolvedStackOptions,
  type StackFaults,
} from './options';
import { writeRawLikeTiff } from './raw-like-tiff';
import { renderScene } from './scene';

export interface RenderedFile {
  /** e.g. FRN_0007.JPG, or FRN_0007.TIF for the raw-like companion */
  name: string;
  buffer: Buffer;
  captureTimeMs: number;
  kind: 'jpeg' | 'raw-like';
  /** position of the exposure in its stack, 0-based */
  frameIndex: number;
}

export interface StackTruth {
  /** where each frame was focused, mm (same zero as the scene's depths) */
  focusDepthsMm: number[];
  /** planned focus step, mm */
  stepMm: number;
  /** exposure of each frame against the nominal one, stops (flicker included) */
  exposureStops: number[];
  captureTimesMs: number[];
  faults: StackFaults;
}

export interface RenderedStack {
  files: RenderedFile[];
  truth: StackTruth;
}

/** Planned focus positions with the injected focus faults applied. */
export function focusDepthsFor(options: ResolvedStackOptions): { focusDepthsMm: number[]; stepMm: number } {
  const [nearMm, farMm] = options.depthRangeMm;
  const stepMm = (farMm - nearMm) / (options.frameCount - 1);
  const { skipStepAt, repeatAt } = options.faults;
  const focusDepthsMm: number[] = [];
  let position = 0;
  for (let i = 0; i < options.frameCount; i++) {
    if (i > 0) {
      position += 1;
      if (skipStepAt !== undefined && i === skipStepAt + 1) position += 1;
      if (repeatAt !== undefined && i === repeatAt + 1) position -= 1;
    }
    focusDepthsMm.push(nearMm + position * stepMm);
  }
  return { focusDepthsMm, stepMm };
}

function exposureStopsFor(options: ResolvedStackOptions, random: () => number): number[] {
  const { exposureJumpAt, exposureJumpPersists } = options.faults;
  const jumpStops = options.faults.exposureStops ?? 1;
  return Array.from({ length: options.frameCount }, (_, i) => {
    const flicker = randomBetween(random, -options.exposureJitterStops, options.exposureJitterStops);
    const extra = options.exposureStopsByFrame?.[i] ?? 0;
    const jumped = exposureJumpAt !== undefined && (i === exposureJumpAt || (exposureJumpPersists === true && i > exposureJumpAt));
    return flicker + extra + (jumped ? jumpStops : 0);
  });
}

function captureTimesFor(options: ResolvedStackOptions, random: () => number): number[] {
  const [shortestS, longestS] = options.intervalS;
  const usualS = randomBetween(random, shortestS, longestS);
  const times = [startTimeMs(options.startTime)];
  for (let i = 1; i < options.frameCount; i++) {
    const intervalS = Math.min(longestS, Math.max(shortestS, usualS * randomBetween(random, 0.85, 1.15)));
    times.push(times[i - 1] + Math.round(intervalS * 1000));
  }
  return times;
}

/** IEC 61966-2-1 sRGB encoding, tabulated over linear 0..1 for speed. */
const SRGB_TABLE_SIZE = 65536;
const srgbTable = (() => {
  const table = new Float32Array(SRGB_TABLE_SIZE + 1);
  for (let i = 0; i <= SRGB_TABLE_SIZE; i++) {
    const linear = i / SRGB_TABLE_SIZE;
    table[i] = 255 * (linear <= 0.0031308 ? 12.92 * linear : 1.055 * linear ** (1 / 2.4) - 0.055);
  }
  return table;
})();

function encodeFrame(linear: Float32Array, gain: number, grain: Float32Array, grainOffset: number, grainDn: number): Buffer {
  const out = Buffer.alloc(linear.length);
  for (let i = 0; i < linear.length; i++) {
    const scaled = Math.min(1, Math.max(0, linear[i] * gain));
    const code = srgbTable[Math.round(scaled * SRGB_TABLE_SIZE)] + grain[grainOffset + i] * grainDn;
    out[i] = code <= 0 ? 0 : code >= 255 ? 255 : Math.round(code);
  }
  return out;
}

export function frameFileName(prefix: string, fileNumber: number, extension: 'JPG' | 'TIF'): string {
  const wrapped = ((fileNumber - 1) % 9999) + 1;
  return `${prefix}${String(wrapped).padStart(4, '0')}.${extension}`;
}

/** Renders one focus stack of a synthetic scene as camera-like JPEGs (and raw-like TIFFs). */
export async function renderStack(input: RenderStackOptions = {}): Promise<RenderedStack> {
  const options = parseRenderStackOptions(input);
  const { widthPx, heightPx, frameCount, seed } = options;
  const random = createRandom(seed * 7919 + 17);
  const { focusDepthsMm, stepMm } = focusDepthsFor(options);
  const exposureStops = exposureStopsFor(options, random);
  const captureTimesMs = captureTimesFor(options, random);
  const [nearMm, farMm] = options.depthRangeMm;
  const scene = renderScene(options.scene, { widthPx, heightPx, seed, subjectNearMm: nearMm, subjectFarMm: farMm });
  const sigmaPxPerStep = options.blurSigmaPxPerStep ?? (1.2 * widthPx) / 800;
  const sigmaPxPerMm = sigmaPxPerStep / stepMm;
  const maxSigmaPx = Math.max(4, 0.045 * Math.max(widthPx, heightPx));
  const ladder = await buildBlurLadder(scene, maxSigmaPx);
  const sampleCount = widthPx * heightPx * 3;
  const grain = fillGrain(sampleCount + 3 * 4096, random);
  const linear = new Float32Array(sampleCount);
  const utcOffsetMinutes = options.utcOffsetMinutes ?? offsetMinutesOf(options.startTime);
  const encodings: Promise<RenderedFile[]>[] = [];
  for (let i = 0; i < frameCount; i++) {
    renderDefocused(scene, ladder, defocusSigmas(scene, focusDepthsMm[i], sigmaPxPerMm, maxSigmaPx), linear);
    const grainOffset = 3 * Math.floor(random() * 4096);
    const rgb = encodeFrame(linear, 2 ** exposureStops[i], grain, grainOffset, options.grainDn);
    const settings: CaptureSettings = {
      captureTimeMs: captureTimesMs[i],
      utcOffsetMinutes,
      exposureTimeS: options.exposureTimeS,
      fNumber: options.fNumber,
      iso: options.iso,
      focalLengthMm: options.focalLengthMm,
      orientation: options.orientation,
      bodySerial: options.bodySerial,
    };
    encodings.push(encodeFiles(rgb, i, settings, options));
  }
  const files = (await Promise.all(encodings)).flat();
  return { files, truth: { focusDepthsMm, stepMm, exposureStops, captureTimesMs, faults: options.faults } };
}

async function encodeFiles(rgb: Buffer, frameIndex: number, settings: CaptureSettings, options: ResolvedStackOptions): Promise<RenderedFile[]> {
  const { widthPx, heightPx } = options;
  const raw = { width: widthPx, height: heightPx, channels: 3 as const };
  const fileNumber = options.firstFileNumber + frameIndex;
  const jpeg = withExifVersion(
    await sharp(rgb, { raw }).withExif(jpegExif(settings)).withMetadata({ orientation: settings.orientation }).jpeg({ quality: options.jpegQuality }).toBuffer(),
    '0232',
  );
  const files: RenderedFile[] = [
    { name: frameFileName(options.filePrefix, fileNumber, 'JPG'), buffer: jpeg, captureTimeMs: settings.captureTimeMs, kind: 'jpeg', frameIndex },
  ];
  if (options.withRaw) {
    const thumbnail = await sharp(rgb, { raw }).resize(160).raw().toBuffer({ resolveWithObject: true });
    const tiff = writeRawLikeTiff({
      rgb,
      widthPx,
      heightPx,
      settings,
      thumbnailRgb: thumbnail.data,
      thumbnailWidthPx: thumbnail.info.width,
      thumbnailHeightPx: thumbnail.info.height,
    });
    files.unshift({ name: frameFileName(options.filePrefix, fileNumber, 'TIF'), buffer: tiff, captureTimeMs: settings.captureTimeMs, kind: 'raw-like', frameIndex });
  }
  return files;
}

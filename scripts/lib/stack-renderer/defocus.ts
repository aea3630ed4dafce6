import sharp from 'sharp';
import type { SceneImage } from './scene';

/**
 * The scene blurred once at a ladder of Gaussian sigmas. A frame focused at depth f then takes,
 * for every pixel, the ladder image whose sigma matches that pixel's defocus |depth - f|
 * (interpolating between rungs): each pixel blurred by its own defocus, at the cost of one
 * blend per frame instead of one blur per depth slice per frame.
 */
export interface BlurLadder {
  sigmasPx: number[];
  /** linear light scaled to 0..65535 */
  images: Uint16Array[];
}

const FULL_SCALE = 65535;

const FIRST_SIGMA = 0.4;
const RATIO = 1.41;
const LOG_RATIO = Math.log(RATIO);

/** Geometric rungs from 0.4 px; 0 is the sharp scene itself. */
export function ladderSigmas(maxSigmaPx: number): number[] {
  const sigmas = [0];
  for (let sigma = FIRST_SIGMA; sigmas.length < 2 || sigmas[sigmas.length - 1] < maxSigmaPx; sigma *= RATIO) sigmas.push(sigma);
  return sigmas;
}

export async function buildBlurLadder(scene: SceneImage, maxSigmaPx: number): Promise<BlurLadder> {
  const sharpScene = new Uint16Array(scene.linearRgb.length);
  for (let i = 0; i < sharpScene.length; i++) {
    sharpScene[i] = Math.round(Math.min(1, Math.max(0, scene.linearRgb[i])) * FULL_SCALE);
  }
  const sigmasPx = ladderSigmas(maxSigmaPx);
  const images = await Promise.all(sigmasPx.map((sigma) => blurLinear(sharpScene, scene, sigma)));
  return { sigmasPx, images };
}

// sharp reads a Uint16Array as 16-bit RGB; keeping 'rgb16' on the way out stops it from
// converting to 8-bit sRGB, so the blur stays in linear light.
async function blurLinear(pixels: Uint16Array, scene: SceneImage, sigmaPx: number): Promise<Uint16Array> {
  const { widthPx, heightPx } = scene;
  if (sigmaPx === 0) return pixels;
  const raw = { width: widthPx, height: heightPx, channels: 3 as const };
  const blur = (sigma: number) => ({ sigma: Math.max(0.3, sigma), minAmplitude: 0.01 });
  // Wide blurs run on a smaller copy: the result is smooth anyway and this keeps a 20-frame
  // stack within seconds. The box average of the shrink adds (factor^2 / 12) px^2 of variance.
  const factor = sigmaPx >= 6 ? Math.floor(sigmaPx / 3) : 1;
  if (factor === 1) {
    return asUint16(await sharp(pixels, { raw }).blur(blur(sigmaPx)).toColourspace('rgb16').raw({ depth: 'ushort' }).toBuffer());
  }
  const smallWidth = Math.max(1, Math.round(widthPx / factor));
  const smallHeight = Math.max(1, Math.round(heightPx / factor));
  const smallSigma = Math.sqrt(Math.max(0.09, sigmaPx ** 2 - factor ** 2 / 12)) / factor;
  const small = await sharp(pixels, { raw })
    .resize(smallWidth, smallHeight, { kernel: 'linear', fit: 'fill' })
    .blur(blur(smallSigma))
    .toColourspace('rgb16')
    .raw({ depth: 'ushort' })
    .toBuffer();
  const back = await sharp(asUint16(small), { raw: { width: smallWidth, height: smallHeight, channels: 3 } })
    .resize(widthPx, heightPx, { kernel: 'linear', fit: 'fill' })
    .toColourspace('rgb16')
    .raw({ depth: 'ushort' })
    .toBuffer();
  return asUint16(back);
}

function asUint16(buffer: Buffer): Uint16Array {
  if (buffer.byteOffset % 2 === 0) return new Uint16Array(buffer.buffer, buffer.byteOffset, buffer.length / 2);
  return new Uint16Array(Uint8Array.prototype.slice.call(buffer).buffer);
}

/**
 * Blur sigma per pixel for one focus depth. A plain per-pixel blur would keep the outline of a
 * blurred foreground (a drop, a beetle) crisp against a sharp background; real defocus spreads
 * the near object's blur over what lies behind it, so the blur of pixels in front of the focus
 * is spread (box-blurred) onto the pixels behind.
 */
export function defocusSigmas(scene: SceneImage, focusMm: number, sigmaPxPerMm: number, maxSigmaPx: number): Float32Array {
  const { widthPx, heightPx, depthMm } = scene;
  const pixelCount = widthPx * heightPx;
  const sigmas = new Float32Array(pixelCount);
  const front = new Float32Array(pixelCount);
  let frontSum = 0;
  let frontCount = 0;
  for (let pixel = 0; pixel < pixelCount; pixel++) {
    const sigma = Math.min(maxSigmaPx, sigmaPxPerMm * Math.abs(depthMm[pixel] - focusMm));
    sigmas[pixel] = sigma;
    if (depthMm[pixel] < focusMm && sigma >= 1) {
      front[pixel] = sigma;
      frontSum += sigma;
      frontCount++;
    }
  }
  if (frontCount === 0) return sigmas;
  const radius = Math.max(1, Math.round((frontSum / frontCount) * 1.2));
  const spread = boxBlur(boxBlur(front, widthPx, heightPx, radius), widthPx, heightPx, radius);
  for (let pixel = 0; pixel < pixelCount; pixel++) {
    if (depthMm[pixel] >= focusMm && spread[pixel] > sigmas[pixel]) sigmas[pixel] = spread[pixel];
  }
  return sigmas;
}

/** Separable running-sum box blur (edges clamped); two passes approximate a Gaussian. */
function boxBlur(source: Float32Array, widthPx: number, heightPx: number, radius: number): Float32Array {
  const across = new Float32Array(source.length);
  const out = new Float32Array(source.length);
  const scale = 1 / (2 * radius + 1);
  for (let y = 0; y < heightPx; y++) {
    const row = y * widthPx;
    let sum = 0;
    for (let i = -radius; i <= radius; i++) sum += source[row + Math.min(widthPx - 1, Math.max(0, i))];
    for (let x = 0; x < widthPx; x++) {
      across[row + x] = sum * scale;
      sum += source[row + Math.min(widthPx - 1, x + radius + 1)] - source[row + Math.max(0, x - radius)];
    }
  }
  for (let x = 0; x < widthPx; x++) {
    let sum = 0;
    for (let i = -radius; i <= radius; i++) sum += across[Math.min(heightPx - 1, Math.max(0, i)) * widthPx + x];
    for (let y = 0; y < heightPx; y++) {
      out[y * widthPx + x] = sum * scale;
      sum += across[Math.min(heightPx - 1, y + radius + 1) * widthPx + x] - across[Math.max(0, y - radius) * widthPx + x];
    }
  }
  return out;
}

/** Linear-light picture of the scene with each pixel blurred by its sigma (see defocusSigmas). */
export function renderDefocused(scene: SceneImage, ladder: BlurLadder, sigmas: Float32Array, out: Float32Array): void {
  const { sigmasPx, images } = ladder;
  const top = sigmasPx.length - 1;
  const pixelCount = scene.widthPx * scene.heightPx;
  for (let pixel = 0; pixel < pixelCount; pixel++) {
    const sigma = Math.min(sigmasPx[top], sigmas[pixel]);
    let rung = sigma < FIRST_SIGMA ? 0 : Math.min(top - 1, 1 + Math.floor(Math.log(sigma / FIRST_SIGMA) / LOG_RATIO));
    if (rung > 1 && sigmasPx[rung] > sigma) rung--;
    const low = sigmasPx[rung];
    const high = sigmasPx[rung + 1];
    const t = Math.min(1, (sigma - low) / (high - low));
    const a = images[rung];
    const b = images[rung + 1];
    const i = pixel * 3;
    out[i] = (a[i] + (b[i] - a[i]) * t) / FULL_SCALE;
    out[i + 1] = (a[i + 1] + (b[i + 1] - a[i + 1]) * t) / FULL_SCALE;
    out[i + 2] = (a[i + 2] + (b[i + 2] - a[i + 2]) * t) / FULL_SCALE;
  }
}

import sharp from 'sharp';

export const SHARPNESS_GRID_COLS = 8;
export const SHARPNESS_GRID_ROWS = 6;
/** Previews are about 1600 px; larger input is shrunk to this first, so scores stay comparable. */
export const FRAME_STATS_MAX_EDGE_PX = 1600;
/** Refuse decompression bombs: no camera preview comes near 100 megapixels. */
export const FRAME_STATS_MAX_INPUT_PIXELS = 100_000_000;

/**
 * Rec. 709 luma weights applied to the gamma-encoded R'G'B' values. This is what ImageMagick 6
 * (6.9.11 on Debian 12) does for `-colorspace Gray`: checked on flat patches, pure red gives
 * 0.21265, pure green 0.71516, pure blue 0.07219, and rgb(128,0,0) gives 0.10675
 * = 0.212656 * 128/255, i.e. no linearisation. Weights from ITU-R BT.709-6, item 3.2.
 */
export const REC709_LUMA_WEIGHTS = [0.212656, 0.715158, 0.072186] as const;

export interface FrameStats {
  /**
   * Mean of the gamma-encoded Rec. 709 luma, 0..1 (as ImageMagick's `-colorspace Gray` mean).
   * Not linear light: convert with srgbToLinear before comparing exposures in stops.
   */
  meanLuminance: number;
  /**
   * Focus measure per cell, row-major (8 columns x 6 rows): the variance of the Laplacian of the
   * 8-bit luma (Pech-Pacheco et al., "Diatom autofocusing in brightfield microscopy: a
   * comparative study", ICPR 2000). Larger is sharper; only comparable between frames of one
   * stack, not across scenes.
   */
  sharpnessGrid: number[];
  gridCols: typeof SHARPNESS_GRID_COLS;
  gridRows: typeof SHARPNESS_GRID_ROWS;
  /** size of the picture measured: after EXIF orientation and any shrink to 1600 px */
  widthPx: number;
  heightPx: number;
}

export class FrameStatsError extends Error {
  override name = 'FrameStatsError';
}

async function decodeRgb(input: Buffer | string): Promise<{ data: Buffer; widthPx: number; heightPx: number }> {
  try {
    const { data, info } = await sharp(input, { limitInputPixels: FRAME_STATS_MAX_INPUT_PIXELS, autoOrient: true })
      .resize(FRAME_STATS_MAX_EDGE_PX, FRAME_STATS_MAX_EDGE_PX, { fit: 'inside', withoutEnlargement: true })
      .removeAlpha()
      .toColourspace('srgb')
      .raw()
      .toBuffer({ resolveWithObject: true });
    if (info.channels !== 3) throw new Error(`expected 3 colour channels, got ${info.channels}`);
    return { data, widthPx: info.width, heightPx: info.height };
  } catch (error) {
    const source = typeof input === 'string' ? input : `a ${input.length}-byte buffer`;
    const reason = error instanceof Error ? error.message : String(error);
    throw new FrameStatsError(`Cannot measure frame statistics of ${source}: ${reason.trim()}`, { cause: error });
  }
}

/** Mean luminance and a grid of sharpness scores of one frame's large preview. */
export async function computeFrameStats(input: Buffer | string): Promise<FrameStats> {
  const { data, widthPx, heightPx } = await decodeRgb(input);
  if (widthPx < SHARPNESS_GRID_COLS * 3 || heightPx < SHARPNESS_GRID_ROWS * 3) {
    throw new FrameStatsError(`Cannot measure frame statistics: the picture is only ${widthPx}x${heightPx} px`);
  }
  const [wr, wg, wb] = REC709_LUMA_WEIGHTS;
  const pixelCount = widthPx * heightPx;
  const luma = new Float32Array(pixelCount);
  let lumaSum = 0;
  for (let pixel = 0, i = 0; pixel < pixelCount; pixel++, i += 3) {
    const value = wr * data[i] + wg * data[i + 1] + wb * data[i + 2];
    luma[pixel] = value;
    lumaSum += value;
  }
  return {
    meanLuminance: lumaSum / pixelCount / 255,
    sharpnessGrid: laplacianVarianceGrid(luma, widthPx, heightPx, SHARPNESS_GRID_COLS, SHARPNESS_GRID_ROWS),
    gridCols: SHARPNESS_GRID_COLS,
    gridRows: SHARPNESS_GRID_ROWS,
    widthPx,
    heightPx,
  };
}

/**
 * Variance of the 4-neighbour Laplacian [0 1 0; 1 -4 1; 0 1 0] per grid cell, over the pixels
 * whose whole 3x3 neighbourhood lies inside the picture.
 */
export function laplacianVarianceGrid(luma: Float32Array, widthPx: number, heightPx: number, cols: number, rows: number): number[] {
  const cellCount = cols * rows;
  const sum = new Float64Array(cellCount);
  const sumSquares = new Float64Array(cellCount);
  const count = new Float64Array(cellCount);
  const colOf = new Int32Array(widthPx);
  for (let x = 0; x < widthPx; x++) colOf[x] = Math.min(cols - 1, Math.floor((x * cols) / widthPx));
  for (let y = 1; y < heightPx - 1; y++) {
    const rowBase = Math.min(rows - 1, Math.floor((y * rows) / heightPx)) * cols;
    const line = y * widthPx;
    for (let x = 1; x < widthPx - 1; x++) {
      const p = line + x;
      const laplacian = luma[p - 1] + luma[p + 1] + luma[p - widthPx] + luma[p + widthPx] - 4 * luma[p];
      const cell = rowBase + colOf[x];
      sum[cell] += laplacian;
      sumSquares[cell] += laplacian * laplacian;
      count[cell] += 1;
    }
  }
  return Array.from(sum, (s, cell) => {
    const mean = s / count[cell];
    return Math.max(0, sumSquares[cell] / count[cell] - mean * mean);
  });
}

import { access, constants } from 'node:fs/promises';
import exifr from 'exifr';
import sharp, { type Sharp } from 'sharp';
import { writeFileAtomic } from './atomic-file';
import { findEmbeddedJpegs, readEmbeddedJpeg } from './embedded-preview';

export type PreviewSourceKind = 'jpeg' | 'png' | 'heif' | 'tiff-raw' | 'dng' | 'bmff-raw';
export type PreviewSource = 'image' | 'embedded-preview' | 'placeholder';

export interface MakePreviewsOptions {
  kind: PreviewSourceKind;
  outSmallPath: string;
  outLargePath: string;
}

export interface PreviewResult {
  source: PreviewSource;
  /** 'no-preview' when a placeholder was written; 'too-large' when the picture exceeded MAX_INPUT_PIXELS. */
  flags: string[];
  /** Size of the large preview. */
  widthPx: number;
  heightPx: number;
  smallWidthPx: number;
  smallHeightPx: number;
}

export const SMALL_PREVIEW_LONG_EDGE_PX = 320;
export const LARGE_PREVIEW_LONG_EDGE_PX = 1600;
/** Above this a picture is not decoded at all: 120 MP is past any stills sensor we expect. */
export const MAX_INPUT_PIXELS = 120_000_000;
const PLACEHOLDER_GREY = '#D9D4CA';
const PLACEHOLDER_MARK = '#5B6B73';
const PAPER = '#F6F4EF';

const RAW_KINDS = new Set<PreviewSourceKind>(['tiff-raw', 'dng', 'bmff-raw']);
// Decoded pictures whose long edge is below this are a RAW's thumbnail page, not its preview.
const THUMBNAIL_LONG_EDGE_PX = 1000;

// EXIF orientation (CIPA DC-008 tag 0x0112) as sharp operations; checked against sharp's own
// autoOrient on tagged files in tests/unit/previews.test.ts.
const ORIENT: Record<number, (image: Sharp) => Sharp> = {
  2: (image) => image.flop(),
  3: (image) => image.rotate(180),
  4: (image) => image.flip(),
  5: (image) => image.rotate(270).flop(),
  6: (image) => image.rotate(90),
  7: (image) => image.rotate(90).flop(),
  8: (image) => image.rotate(270),
};

interface Candidate {
  input: string | Buffer;
  source: Exclude<PreviewSource, 'placeholder'>;
  longEdgePx: number;
  /** Orientation to apply when the picture carries none of its own (embedded previews). */
  containerOrientation: number;
}

type Probe = { kind: 'ok'; candidate: Candidate } | { kind: 'too-large' } | { kind: 'unreadable' };

const sharpOptions = { limitInputPixels: MAX_INPUT_PIXELS, failOn: 'error' as const };

async function probe(input: string | Buffer, source: Candidate['source'], containerOrientation: number): Promise<Probe> {
  try {
    const meta = await sharp(input, sharpOptions).metadata();
    if (!meta.width || !meta.height) return { kind: 'unreadable' };
    if (meta.width * meta.height > MAX_INPUT_PIXELS) return { kind: 'too-large' };
    const longEdgePx = Math.max(meta.width, meta.height);
    return { kind: 'ok', candidate: { input, source, longEdgePx, containerOrientation: meta.orientation ? 1 : containerOrientation } };
  } catch (error) {
    return /pixel limit/i.test((error as Error).message) ? { kind: 'too-large' } : { kind: 'unreadable' };
  }
}

async function containerOrientationOf(path: string): Promise<number> {
  try {
    const orientation = await exifr.orientation(path);
    return typeof orientation === 'number' && orientation >= 1 && orientation <= 8 ? orientation : 1;
  } catch {
    return 1;
  }
}

function fitInside(image: Sharp, longEdgePx: number): Sharp {
  return image.resize(longEdgePx, longEdgePx, { fit: 'inside', withoutEnlargement: true });
}

async function encodePair(candidate: Candidate) {
  let image = sharp(candidate.input, sharpOptions).autoOrient();
  image = ORIENT[candidate.containerOrientation]?.(image) ?? image;
  const large = await fitInside(image.flatten({ background: PAPER }), LARGE_PREVIEW_LONG_EDGE_PX)
    .jpeg({ quality: 82 })
    .toBuffer({ resolveWithObject: true });
  const small = await fitInside(sharp(large.data), SMALL_PREVIEW_LONG_EDGE_PX)
    .jpeg({ quality: 80 })
    .toBuffer({ resolveWithObject: true });
  return { large, small };
}

function placeholderSvg(widthPx: number, heightPx: number): string {
  // A frame with a diagonal through it: "no picture here", without any text to render.
  const markW = Math.round(Math.min(widthPx, heightPx) * 0.28);
  const markH = Math.round(markW * 0.7);
  const x = Math.round((widthPx - markW) / 2);
  const y = Math.round((heightPx - markH) / 2);
  const stroke = Math.max(2, Math.round(markW / 18));
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${widthPx}" height="${heightPx}">
<rect width="100%" height="100%" fill="${PLACEHOLDER_GREY}"/>
<rect x="${x}" y="${y}" width="${markW}" height="${markH}" rx="${stroke * 2}" fill="none" stroke="${PLACEHOLDER_MARK}" stroke-width="${stroke}"/>
<line x1="${x}" y1="${y + markH}" x2="${x + markW}" y2="${y}" stroke="${PLACEHOLDER_MARK}" stroke-width="${stroke}"/>
</svg>`;
}

async function placeholderJpeg(longEdgePx: number) {
  const widthPx = longEdgePx;
  const heightPx = Math.round((longEdgePx * 2) / 3);
  return sharp(Buffer.from(placeholderSvg(widthPx, heightPx))).jpeg({ quality: 85 }).toBuffer({ resolveWithObject: true });
}

async function embeddedCandidates(path: string, orientation: number): Promise<Probe[]> {
  const jpegs = await findEmbeddedJpegs(path);
  // Largest first; probe until one decodes so a damaged big preview falls back to a smaller one.
  jpegs.sort((a, b) => b.widthPx * b.heightPx - a.widthPx * a.heightPx);
  const probes: Probe[] = [];
  for (const jpeg of jpegs) {
    if (jpeg.widthPx * jpeg.heightPx > MAX_INPUT_PIXELS) {
      probes.push({ kind: 'too-large' });
      continue;
    }
    const result = await probe(await readEmbeddedJpeg(path, jpeg), 'embedded-preview', orientation);
    probes.push(result);
    if (result.kind === 'ok') break;
  }
  return probes;
}

/**
 * Writes a small (≈320 px) and a large (≈1600 px) JPEG preview of one frame. The picture comes
 * from the file itself, else from a RAW's embedded preview, else a neutral placeholder; an
 * undecodable or oversized picture never throws. A missing or unreadable source file does.
 */
export async function makePreviews(sourcePath: string, options: MakePreviewsOptions): Promise<PreviewResult> {
  try {
    await access(sourcePath, constants.R_OK);
  } catch (error) {
    throw new Error(`preview source cannot be read at ${sourcePath}: ${(error as Error).message}`, { cause: error });
  }

  const probes: Probe[] = [];
  if (options.kind !== 'bmff-raw') probes.push(await probe(sourcePath, 'image', 1));
  const direct = probes[0]?.kind === 'ok' ? probes[0].candidate : null;
  // HEIF headers often parse where the prebuilt libvips cannot decode the pictures (HEVC), so
  // their Exif thumbnail is looked for as well.
  const wantsEmbedded = RAW_KINDS.has(options.kind)
    ? !direct || direct.longEdgePx < THUMBNAIL_LONG_EDGE_PX
    : options.kind === 'heif' || !direct;
  if (wantsEmbedded && options.kind !== 'png') {
    probes.push(...(await embeddedCandidates(sourcePath, await containerOrientationOf(sourcePath))));
  }

  const usable = probes.flatMap((p) => (p.kind === 'ok' ? [p.candidate] : []));
  usable.sort((a, b) => b.longEdgePx - a.longEdgePx);
  const flags: string[] = [];
  for (const candidate of usable) {
    try {
      const { large, small } = await encodePair(candidate);
      await Promise.all([writeFileAtomic(options.outLargePath, large.data), writeFileAtomic(options.outSmallPath, small.data)]);
      return {
        source: candidate.source,
        flags,
        widthPx: large.info.width,
        heightPx: large.info.height,
        smallWidthPx: small.info.width,
        smallHeightPx: small.info.height,
      };
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code) throw error; // a write failed: not the picture's fault
    }
  }

  flags.push('no-preview');
  if (probes.some((p) => p.kind === 'too-large')) flags.push('too-large');
  const [large, small] = await Promise.all([placeholderJpeg(LARGE_PREVIEW_LONG_EDGE_PX), placeholderJpeg(SMALL_PREVIEW_LONG_EDGE_PX)]);
  await Promise.all([writeFileAtomic(options.outLargePath, large.data), writeFileAtomic(options.outSmallPath, small.data)]);
  return {
    source: 'placeholder',
    flags,
    widthPx: large.info.width,
    heightPx: large.info.height,
    smallWidthPx: small.info.width,
    smallHeightPx: small.info.height,
  };
}

// A frame's capture metadata, read from its metadata blocks only (never the whole file).
import { open } from 'node:fs/promises';
import exifr from 'exifr';
import { fileNumberOf } from '../../shared/file-names';

export type MetadataFlag = 'no-capture-time' | 'implausible-capture-time' | 'metadata-unreadable' | 'truncated-file';

export interface CaptureMetadata {
  /** Absolute ms. From EXIF when readable, else the file time; null when neither is known. */
  captureTimeMs: number | null;
  captureTimeSource: 'exif' | 'file-time';
  /** The camera's offset from UTC; null when it wrote none (the wall clock is then read as UTC). */
  offsetMinutes: number | null;
  subSecMs: number | null;
  exposureTimeS: number | null;
  fNumber: number | null;
  iso: number | null;
  focalLengthMm: number | null;
  orientation: number | null;
  widthPx: number | null;
  heightPx: number | null;
  bodySerial: string | null;
  fileNumber: number | null;
  /** 'no-capture-time' is present whenever the time is the file time. */
  flags: MetadataFlag[];
}

export interface MetadataContext {
  fileName: string;
  /** The file's modification time as the card recorded it; the fallback capture time. */
  fileMtimeMs: number | null;
}

// Only the tags Lamella uses, from IFD0 and the EXIF IFD; everything else stays unparsed.
const EXIFR_OPTIONS = {
  tiff: true,
  ifd0: { pick: ['Orientation', 'ImageWidth', 'ImageHeight', 'SubfileType', 'CameraSerialNumber'] },
  exif: {
    pick: [
      'DateTimeOriginal', 'SubSecTimeOriginal', 'OffsetTimeOriginal', 'CreateDate', 'SubSecTimeDigitized',
      'OffsetTimeDigitized', 'ExposureTime', 'FNumber', 'ISO', 'ISOSpeed', 'FocalLength', 'ExifImageWidth',
      'ExifImageHeight', 'SerialNumber',
    ],
  },
  ifd1: false, gps: false, interop: false, makerNote: false, userComment: false,
  xmp: false, icc: false, iptc: false, jfif: false, ihdr: false,
  // Revived dates land in the process's time zone without sub-seconds or offset: combine ourselves.
  reviveValues: false,
  translateValues: false,
  mergeOutput: true,
};

// Plausible camera clocks; a year 0 or 2150 is a clock that was never set or a damaged block.
const EARLIEST_YEAR = 1900;
const LATEST_YEAR = 2099;
const MAX_OFFSET_MINUTES = 14 * 60; // UTC-12:00 … UTC+14:00 are the zones in use
// EXIF 2.3 (CIPA DC-008): a sensitivity above 65535 is written as 65535 and the value goes to
// ISOSpeed (from memory).
const ISO_OVERFLOW = 65535;
const JPEG_TAIL_BYTES = 64;

type Tags = Record<string, unknown>;

const text = (value: unknown): string | null => (typeof value === 'string' ? value.replace(/\0+$/, '').trim() || null : null);

function positive(value: unknown): number | null {
  const number = Array.isArray(value) || ArrayBuffer.isView(value) ? (value as ArrayLike<unknown>)[0] : value;
  return typeof number === 'number' && Number.isFinite(number) && number > 0 ? number : null;
}

/** "045" -> 45 ms, "5" -> 500 ms: the digits are a decimal fraction of a second (EXIF 2.3, SubSecTime). */
export function subSecondsToMs(value: unknown): number | null {
  const digits = /^\s*(\d+)\s*$/.exec(text(value) ?? '')?.[1];
  return digits ? Number(`${digits}00`.slice(0, 3)) : null;
}

/** "+05:30" -> 330, "-03:00" -> -180 (EXIF 2.31, OffsetTime); null when absent or malformed. */
export function offsetToMinutes(value: unknown): number | null {
  const match = /^([+-])(\d{2}):(\d{2})$/.exec(text(value) ?? '');
  if (!match) return null;
  const minutes = (Number(match[2]) * 60 + Number(match[3])) * (match[1] === '-' ? -1 : 1);
  return Math.abs(minutes) <= MAX_OFFSET_MINUTES ? minutes : null;
}

type WallClock = { kind: 'absent' } | { kind: 'implausible' } | { kind: 'ok'; utcMs: number };

/** EXIF "YYYY:MM:DD HH:MM:SS" read as if it were UTC. */
export function parseExifDateTime(value: unknown): WallClock {
  const raw = text(value);
  if (raw === null || /^[\s:]*$/.test(raw)) return { kind: 'absent' }; // blank: a camera without clock
  const match = /^(\d{4})[:-](\d{2})[:-](\d{2})[ T](\d{2}):(\d{2}):(\d{2})/.exec(raw);
  if (!match) return { kind: 'implausible' };
  const [year, month, day, hour, minute, second] = match.slice(1).map(Number);
  const utcMs = Date.UTC(year, month - 1, day, hour, minute, second);
  const date = new Date(utcMs);
  const sameFields = date.getUTCFullYear() === year && date.getUTCMonth() === month - 1 && date.getUTCDate() === day
    && date.getUTCHours() === hour && date.getUTCMinutes() === minute && date.getUTCSeconds() === second;
  if (!sameFields || year < EARLIEST_YEAR || year > LATEST_YEAR) return { kind: 'implausible' };
  return { kind: 'ok', utcMs };
}

function widthAndHeight(tags: Tags): [number | null, number | null] {
  const exifWidth = positive(tags.ExifImageWidth);
  const exifHeight = positive(tags.ExifImageHeight);
  if (exifWidth !== null && exifHeight !== null) return [exifWidth, exifHeight];
  // IFD0 of a TIFF is the picture itself unless it is marked a reduced-resolution preview.
  const ifd0IsPreview = typeof tags.SubfileType === 'number' && (tags.SubfileType & 1) === 1;
  if (ifd0IsPreview) return [null, null];
  return [positive(tags.ImageWidth), positive(tags.ImageHeight)];
}

interface FileProbe { isJpeg: boolean; endsCleanly: boolean; sizeBytes: number }

/** The first bytes (is it a JPEG?) and, for a JPEG, the last: a complete one ends in EOI FF D9. */
async function probeFile(path: string): Promise<FileProbe> {
  const handle = await open(path, 'r');
  try {
    const { size } = await handle.stat();
    const head = new Uint8Array(3);
    await handle.read(head, 0, 3, 0);
    const isJpeg = size >= 3 && head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff;
    if (!isJpeg) return { isJpeg, endsCleanly: true, sizeBytes: size };
    const tailLength = Math.min(JPEG_TAIL_BYTES, size);
    const tail = new Uint8Array(tailLength);
    await handle.read(tail, 0, tailLength, size - tailLength);
    return { isJpeg, endsCleanly: jpegEndsCleanly(tail), sizeBytes: size };
  } finally {
    await handle.close();
  }
}

/** EOI, optionally followed by padding (0x00 or 0xFF) as some cameras write. */
function jpegEndsCleanly(tail: Uint8Array): boolean {
  let end = tail.length;
  while (end > 0 && (tail[end - 1] === 0x00 || tail[end - 1] === 0xff)) end -= 1;
  return end >= 2 && tail[end - 1] === 0xd9 && tail[end - 2] === 0xff;
}

async function readTags(input: string | Uint8Array, flags: MetadataFlag[]): Promise<Tags> {
  if (input.length === 0) {
    flags.push('metadata-unreadable');
    return {};
  }
  try {
    const tags = (await exifr.parse(input, EXIFR_OPTIONS)) as (Tags & { errors?: unknown[] }) | undefined;
    if (tags?.errors && tags.errors.length > 0) flags.push('metadata-unreadable');
    return tags ?? {};
  } catch {
    flags.push('metadata-unreadable'); // exifr's "Unknown file format" and broken blocks alike
    return {};
  }
}

/**
 * Reads a frame's capture metadata from a file path (exifr reads the metadata blocks in chunks)
 * or from a buffer holding at least the file's metadata blocks (for a JPEG, its first 128 KiB).
 * Broken or missing metadata becomes flags; only I/O errors on the path (missing file, no
 * permission) throw.
 */
export async function readCaptureMetadata(input: string | Uint8Array, context: MetadataContext): Promise<CaptureMetadata> {
  const flags: MetadataFlag[] = [];
  let source: string | Uint8Array = input;
  if (typeof input === 'string') {
    const probe = await probeFile(input);
    if (probe.isJpeg && !probe.endsCleanly) flags.push('truncated-file');
    if (probe.sizeBytes === 0) source = new Uint8Array(0);
  }
  const tags = await readTags(source, flags);

  const original = parseExifDateTime(tags.DateTimeOriginal);
  const useDigitized = original.kind === 'absent';
  const wallClock = useDigitized ? parseExifDateTime(tags.CreateDate) : original;
  const subSecMs = subSecondsToMs(useDigitized ? tags.SubSecTimeDigitized : tags.SubSecTimeOriginal);
  const offsetMinutes = offsetToMinutes(useDigitized ? tags.OffsetTimeDigitized : tags.OffsetTimeOriginal);

  let captureTimeMs: number | null;
  let captureTimeSource: CaptureMetadata['captureTimeSource'];
  if (wallClock.kind === 'ok') {
    captureTimeMs = wallClock.utcMs + (subSecMs ?? 0) - (offsetMinutes ?? 0) * 60_000;
    captureTimeSource = 'exif';
  } else {
    if (wallClock.kind === 'implausible') flags.push('implausible-capture-time');
    flags.push('no-capture-time');
    captureTimeMs = typeof context.fileMtimeMs === 'number' && Number.isFinite(context.fileMtimeMs) ? context.fileMtimeMs : null;
    captureTimeSource = 'file-time';
  }

  const iso = positive(tags.ISO);
  const orientation = positive(tags.Orientation);
  const [widthPx, heightPx] = widthAndHeight(tags);
  return {
    captureTimeMs,
    captureTimeSource,
    offsetMinutes: captureTimeSource === 'exif' ? offsetMinutes : null,
    subSecMs: captureTimeSource === 'exif' ? subSecMs : null,
    exposureTimeS: positive(tags.ExposureTime),
    fNumber: positive(tags.FNumber),
    iso: iso === ISO_OVERFLOW ? (positive(tags.ISOSpeed) ?? iso) : iso,
    focalLengthMm: positive(tags.FocalLength),
    orientation: orientation !== null && Number.isInteger(orientation) && orientation <= 8 ? orientation : null,
    widthPx,
    heightPx,
    bodySerial: text(tags.SerialNumber) ?? text(tags.CameraSerialNumber),
    fileNumber: fileNumberOf(context.fileName),
    flags,
  };
}

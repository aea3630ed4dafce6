// Test pictures made with sharp, tagged and read back with Debian's exiftool (the outside
// reference for metadata). Used by unit tests and benchmarks.
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';
import sharp from 'sharp';

const run = promisify(execFile);
export const EXIFTOOL = '/usr/bin/exiftool';

export type TagValues = Record<string, string | number>;

export interface PictureOptions {
  widthPx?: number;
  heightPx?: number;
  /** A flat colour; a fern-green by default. */
  background?: string;
  /** Gaussian noise instead of a flat colour: files as large as real pictures of that size. */
  noise?: boolean;
}

function canvas({ widthPx = 96, heightPx = 64, background = '#4f7a3a', noise = false }: PictureOptions) {
  const create = { width: widthPx, height: heightPx, channels: 3 as const, background };
  return sharp({ create: noise ? { ...create, noise: { type: 'gaussian' as const, mean: 110, sigma: 40 } } : create });
}

export async function makeJpeg(path: string, options: PictureOptions = {}): Promise<void> {
  await canvas(options).jpeg({ quality: 80 }).toFile(path);
}

export async function makeTiff(path: string, options: PictureOptions = {}): Promise<void> {
  await canvas(options).tiff({ compression: 'lzw' }).toFile(path);
}

export async function makePng(path: string, options: PictureOptions = {}): Promise<void> {
  await canvas(options).png().toFile(path);
}

/**
 * "#" writes the value itself (Orientation 6), not exiftool's printed form ("Rotate 90 CW"); numbers
 * always go that way, strings when the name ends in "#" (to write a date exiftool would refuse).
 */
function tagArguments(tags: TagValues): string[] {
  return Object.entries(tags).map(([name, value]) => {
    const raw = typeof value === 'number' && !name.endsWith('#') ? `${name}#` : name;
    return `-${raw}=${value}`;
  });
}

/** Writes tags into one file in place. */
export async function writeTags(path: string, tags: TagValues): Promise<void> {
  await run(EXIFTOOL, ['-q', '-overwrite_original', ...tagArguments(tags), path]);
}

/** Writes different tags into many files with one exiftool process (-stay_open would be faster still). */
export async function writeTagsToMany(entries: { path: string; tags: TagValues }[]): Promise<void> {
  const lines = entries.flatMap(({ path, tags }) => ['-q', '-overwrite_original', ...tagArguments(tags), path, '-execute']);
  await new Promise<void>((resolve, reject) => {
    const child = execFile(EXIFTOOL, ['-@', '-'], { maxBuffer: 16 * 1024 * 1024 }, (error) => (error ? reject(error) : resolve()));
    child.stdin?.end(lines.join('\n') + '\n');
  });
}

/** exiftool's reading with numbers unformatted (-n) and tags keyed by group, e.g. "EXIF:FNumber". */
export async function readWithExiftool(paths: string[], extra: string[] = []): Promise<Record<string, unknown>[]> {
  const { stdout } = await run(EXIFTOOL, ['-j', '-n', '-G', ...extra, ...paths], { maxBuffer: 64 * 1024 * 1024 });
  return JSON.parse(stdout) as Record<string, unknown>[];
}

/**
 * exiftool's composite "SubSecDateTimeOriginal" ("2025:05:17 23:59:58.045+05:30") as absolute ms,
 * with the conversion left to the JavaScript engine's ISO 8601 parser. Without an offset the
 * wall-clock time is read as UTC, Lamella's documented rule.
 */
export function exiftoolTimeToMs(subSecDateTime: string): number {
  const match = /^(\d{4}):(\d{2}):(\d{2}) (\d{2}:\d{2}:\d{2})(\.\d+)?([+-]\d{2}:\d{2}|Z)?$/.exec(subSecDateTime);
  if (!match) throw new Error(`exiftool date not understood: ${subSecDateTime}`);
  const [, year, month, day, time, fraction = '', zone = 'Z'] = match;
  return Date.parse(`${year}-${month}-${day}T${time}${fraction.slice(0, 4)}${zone}`);
}

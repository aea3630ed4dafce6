import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCaptureMetadata, type CaptureMetadata } from '../../server/lib/metadata';
import {
  exiftoolTimeToMs,
  makeJpeg,
  makePng,
  makeTiff,
  readWithExiftool,
  writeTags,
  type TagValues,
} from '../helpers/exiftool';

// Every expected value comes from Debian's exiftool (`exiftool -j -n -G`) reading the same file;
// the tag values written are the studio's own scenario (fern, watch movement, beetle).
const FILE_MTIME_MS = Date.UTC(2025, 4, 18, 7, 0, 0);

interface Sample {
  name: string;
  fileName: string;
  make: 'jpeg' | 'tiff';
  tags: TagValues;
}

const TAGGED: Sample[] = [
  {
    name: 'fern JPEG, offset +05:30 and 3-digit sub-seconds',
    fileName: 'FRN_0042.JPG',
    make: 'jpeg',
    tags: {
      DateTimeOriginal: '2025:05:17 09:41:07', SubSecTimeOriginal: '045', OffsetTimeOriginal: '+05:30',
      ExposureTime: 0.008, FNumber: 5.6, ISO: 200, FocalLength: 100, Orientation: 6,
      SerialNumber: 'STUDIO-BODY-0042', ExifImageWidth: 96, ExifImageHeight: 64,
    },
  },
  {
    name: 'watch movement JPEG a half second before local midnight at -03:00',
    fileName: 'frame-0107.jpg',
    make: 'jpeg',
    tags: {
      DateTimeOriginal: '2025:05:17 23:59:59', SubSecTimeOriginal: '5', OffsetTimeOriginal: '-03:00',
      ExposureTime: 0.25, FNumber: 11, ISO: 100, FocalLength: 65, Orientation: 1,
      SerialNumber: 'STUDIO-BODY-0007', ExifImageWidth: 96, ExifImageHeight: 64,
    },
  },
  {
    name: 'beetle JPEG without offset (wall clock read as UTC)',
    fileName: 'FRN_9999.JPG',
    make: 'jpeg',
    tags: {
      DateTimeOriginal: '2025:05:18 14:02:33', SubSecTimeOriginal: '20',
      ExposureTime: 1.6, FNumber: 8, ISO: 64, FocalLength: 90, Orientation: 8,
      ExifImageWidth: 96, ExifImageHeight: 64,
    },
  },
  {
    name: 'TIFF with 4-digit sub-seconds and pixel size from IFD0',
    fileName: 'FRN_0500.TIF',
    make: 'tiff',
    tags: {
      DateTimeOriginal: '2025:05:17 10:00:00', SubSecTimeOriginal: '1239', OffsetTimeOriginal: '+00:00',
      ExposureTime: 0.004, FNumber: 16, ISO: 400, FocalLength: 100, Orientation: 3, SerialNumber: 'STUDIO-BODY-0042',
    },
  },
];

let dir: string;
const pathOf = (fileName: string) => join(dir, fileName);
const readOne = (fileName: string) => readCaptureMetadata(pathOf(fileName), { fileName, fileMtimeMs: FILE_MTIME_MS });

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lamella-metadata-'));
  for (const sample of TAGGED) {
    const path = pathOf(sample.fileName);
    await (sample.make === 'jpeg' ? makeJpeg(path) : makeTiff(path, { widthPx: 120, heightPx: 80 }));
    await writeTags(path, sample.tags);
  }
  await makeJpeg(pathOf('no-exif.jpg'));
  await makePng(pathOf('fern.png'));
  await makeJpeg(pathOf('year-2150.jpg'));
  await writeTags(pathOf('year-2150.jpg'), { DateTimeOriginal: '2150:01:01 10:00:00', FNumber: 8 });
  await makeJpeg(pathOf('year-0.jpg'));
  await writeTags(pathOf('year-0.jpg'), { 'DateTimeOriginal#': '0000:00:00 00:00:00' });
  await makeJpeg(pathOf('created-only.jpg'));
  await writeTags(pathOf('created-only.jpg'), { CreateDate: '2025:05:17 11:00:00', SubSecTimeDigitized: '250', OffsetTimeDigitized: '+02:00' });
  const whole = await readFile(pathOf('FRN_0042.JPG'));
  await writeFile(pathOf('cut-after-exif.jpg'), whole.subarray(0, whole.length - 40));
  await writeFile(pathOf('cut-inside-exif.jpg'), whole.subarray(0, 120));
  await writeFile(pathOf('empty.jpg'), new Uint8Array(0));
  await writeFile(pathOf('shot-list.jpg'), 'fern stack 1: 42 frames at f/5.6\nwatch movement: 60 frames\n');
}, 30_000);

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('readCaptureMetadata against exiftool', () => {
  it.each(TAGGED)('$name', async ({ fileName, make }) => {
    const [reference] = await readWithExiftool([pathOf(fileName)]);
    const read: CaptureMetadata = await readOne(fileName);
    const original = reference['EXIF:DateTimeOriginal'] as string;
    const composite = (reference['Composite:SubSecDateTimeOriginal'] as string | undefined) ?? original;
    const expectedMs = exiftoolTimeToMs(composite);
    const offset = reference['EXIF:OffsetTimeOriginal'] as string | undefined;

    expect(read.captureTimeSource).toBe('exif');
    expect(read.captureTimeMs).toBe(expectedMs);
    expect(read.subSecMs).toBe(((expectedMs % 1000) + 1000) % 1000);
    expect(read.offsetMinutes).toBe(offset === undefined ? null : (exiftoolTimeToMs(original) - exiftoolTimeToMs(`${original}${offset}`)) / 60_000);
    expect(read.exposureTimeS).toBeCloseTo(reference['EXIF:ExposureTime'] as number, 9);
    expect(read.fNumber).toBeCloseTo(reference['EXIF:FNumber'] as number, 6);
    expect(read.iso).toBe(reference['EXIF:ISO']);
    expect(read.focalLengthMm).toBeCloseTo(reference['EXIF:FocalLength'] as number, 6);
    expect(read.orientation).toBe(reference['EXIF:Orientation']);
    const widthKey = make === 'jpeg' ? 'EXIF:ExifImageWidth' : 'EXIF:ImageWidth';
    const heightKey = make === 'jpeg' ? 'EXIF:ExifImageHeight' : 'EXIF:ImageHeight';
    expect([read.widthPx, read.heightPx]).toEqual([reference[widthKey], reference[heightKey]]);
    expect(read.bodySerial).toBe(reference['EXIF:SerialNumber'] ?? null);
    expect(read.flags).toEqual([]);
  });

  it('reads the same from a first-chunk buffer as from the path', async () => {
    const bytes = (await readFile(pathOf('FRN_0042.JPG'))).subarray(0, 128 * 1024);
    const fromBuffer = await readCaptureMetadata(bytes, { fileName: 'FRN_0042.JPG', fileMtimeMs: FILE_MTIME_MS });
    expect(fromBuffer).toEqual(await readOne('FRN_0042.JPG'));
  });

  it('does not depend on the process time zone', async () => {
    const before = await readOne('FRN_9999.JPG');
    const zone = process.env.TZ;
    process.env.TZ = 'Asia/Kathmandu'; // UTC+05:45, far from this machine's zone
    try {
      expect(await readOne('FRN_9999.JPG')).toEqual(before);
    } finally {
      if (zone === undefined) delete process.env.TZ;
      else process.env.TZ = zone;
    }
  });

  it('falls back to the digitized time when the original time is missing', async () => {
    const [reference] = await readWithExiftool([pathOf('created-only.jpg')]);
    const read = await readOne('created-only.jpg');
    expect(read.captureTimeMs).toBe(exiftoolTimeToMs(reference['Composite:SubSecCreateDate'] as string));
    expect(read.offsetMinutes).toBe(120);
  });

  it('takes the file number from the name', async () => {
    expect((await readOne('frame-0107.jpg')).fileNumber).toBe(107);
  });
});

describe('files without a usable capture time keep their file time and are flagged', () => {
  it.each([
    ['no-exif.jpg', ['no-capture-time']],
    ['fern.png', ['no-capture-time']],
    ['year-2150.jpg', ['implausible-capture-time', 'no-capture-time']],
    ['year-0.jpg', ['implausible-capture-time', 'no-capture-time']],
    ['empty.jpg', ['metadata-unreadable', 'no-capture-time']],
    ['shot-list.jpg', ['metadata-unreadable', 'no-capture-time']],
  ])('%s -> %j', async (fileName, flags) => {
    const read = await readOne(fileName);
    expect(read.flags).toEqual(flags);
    expect(read).toMatchObject({ captureTimeMs: FILE_MTIME_MS, captureTimeSource: 'file-time', offsetMinutes: null, subSecMs: null });
  });

  it('keeps the other tags of a file with an implausible date', async () => {
    const [reference] = await readWithExiftool([pathOf('year-2150.jpg')]);
    expect((await readOne('year-2150.jpg')).fNumber).toBe(reference['EXIF:FNumber']);
  });

  it('gives null when there is no file time either', async () => {
    const read = await readCaptureMetadata(pathOf('no-exif.jpg'), { fileName: 'no-exif.jpg', fileMtimeMs: null });
    expect(read).toMatchObject({ captureTimeMs: null, captureTimeSource: 'file-time' });
  });
});

describe('damaged files: flags, never a throw', () => {
  it('a JPEG cut after its metadata keeps its capture time and is flagged truncated', async () => {
    const [reference] = await readWithExiftool([pathOf('FRN_0042.JPG')]);
    const read = await readOne('cut-after-exif.jpg');
    expect(read.captureTimeMs).toBe(exiftoolTimeToMs(reference['Composite:SubSecDateTimeOriginal'] as string));
    expect(read.flags).toEqual(['truncated-file']);
  });

  it('a JPEG cut inside its metadata block is flagged truncated, without capture time', async () => {
    const read = await readOne('cut-inside-exif.jpg');
    expect(read.flags).toContain('truncated-file');
    expect(read.flags).toContain('no-capture-time');
    expect(read.captureTimeMs).toBe(FILE_MTIME_MS);
  });

  it('a buffer holding only a broken metadata block is flagged unreadable', async () => {
    const bytes = (await readFile(pathOf('FRN_0042.JPG'))).subarray(0, 120);
    const read = await readCaptureMetadata(bytes, { fileName: 'FRN_0042.JPG', fileMtimeMs: FILE_MTIME_MS });
    expect(read.flags).toEqual(['metadata-unreadable', 'no-capture-time']);
  });

  it('an empty buffer is flagged, not thrown', async () => {
    const read = await readCaptureMetadata(new Uint8Array(0), { fileName: 'x.jpg', fileMtimeMs: FILE_MTIME_MS });
    expect(read.flags).toEqual(['metadata-unreadable', 'no-capture-time']);
  });

  it('a missing path is an I/O error with the path in its message', async () => {
    await expect(readOne('not-there.jpg')).rejects.toThrow(/ENOENT.*not-there\.jpg/);
  });
});

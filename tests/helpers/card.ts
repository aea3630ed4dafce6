// Small tagged pictures for upload tests: sharp writes the EXIF block (the same writer the stack
// renderer uses), so capture times, settings and serials are what a camera would record.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { writeTags } from './exiftool';
import { exifTimeFields, jpegExif, type CaptureSettings } from '../../scripts/lib/stack-renderer/capture-metadata';

export const BASE_TIME_MS = Date.UTC(2026, 4, 14, 9, 30, 0);

export function settings(captureTimeMs: number, over: Partial<CaptureSettings> = {}): CaptureSettings {
  return {
    captureTimeMs,
    utcOffsetMinutes: 120,
    exposureTimeS: 1 / 125,
    fNumber: 8,
    iso: 200,
    focalLengthMm: 100,
    bodySerial: 'BODY-A-0001',
    orientation: 1,
    ...over,
  };
}

export async function taggedJpeg(s: CaptureSettings, shade = 120): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: { r: shade, g: 140, b: 90 } } })
    .withExif(jpegExif(s))
    .jpeg({ quality: 70 })
    .toBuffer();
}

/** A TIFF-based "raw-like" file; sharp writes no EXIF into TIFF, so exiftool tags it. */
export async function taggedTiff(s: CaptureSettings, shade = 90): Promise<Buffer> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-tiff-'));
  const file = path.join(dir, 'frame.tif');
  try {
    await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: shade, g: 120, b: 60 } } }).tiff().toFile(file);
    const t = exifTimeFields(s.captureTimeMs, s.utcOffsetMinutes);
    await writeTags(file, {
      'DateTimeOriginal#': t.dateTime, 'SubSecTimeOriginal#': t.subSec, 'OffsetTimeOriginal#': t.offset,
      ExposureTime: s.exposureTimeS, FNumber: s.fNumber, ISO: s.iso, FocalLength: s.focalLengthMm, 'SerialNumber#': s.bodySerial,
    });
    return fs.readFileSync(file);
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

import type { Exif } from 'sharp';

/** What a body writes about one exposure. */
export interface CaptureSettings {
  captureTimeMs: number;
  /** minutes east of UTC, as written to OffsetTimeOriginal */
  utcOffsetMinutes: number;
  exposureTimeS: number;
  fNumber: number;
  iso: number;
  focalLengthMm: number;
  orientation: 1 | 3 | 6 | 8;
  bodySerial: string;
}

export interface ExifTimeFields {
  dateTime: string;
  subSec: string;
  offset: string;
}

const pad = (value: number, width = 2) => String(value).padStart(width, '0');

/** EXIF 2.31 wall-clock time: local "YYYY:MM:DD HH:MM:SS", milliseconds and "+HH:MM" apart. */
export function exifTimeFields(captureTimeMs: number, utcOffsetMinutes: number): ExifTimeFields {
  const local = new Date(captureTimeMs + utcOffsetMinutes * 60_000);
  const dateTime =
    `${local.getUTCFullYear()}:${pad(local.getUTCMonth() + 1)}:${pad(local.getUTCDate())} ` +
    `${pad(local.getUTCHours())}:${pad(local.getUTCMinutes())}:${pad(local.getUTCSeconds())}`;
  const sign = utcOffsetMinutes < 0 ? '-' : '+';
  const offsetAbs = Math.abs(utcOffsetMinutes);
  const offset = `${sign}${pad(Math.floor(offsetAbs / 60))}:${pad(offsetAbs % 60)}`;
  return { dateTime, subSec: pad(local.getUTCMilliseconds(), 3), offset };
}

/** A rational as [numerator, denominator]: 1/160 s as 1/160, longer times and f-numbers in tenths. */
export function exposureTimeRational(exposureTimeS: number): [number, number] {
  if (exposureTimeS < 1) return [1, Math.round(1 / exposureTimeS)];
  return [Math.round(exposureTimeS * 10), 10];
}

export function tenthsRational(value: number): [number, number] {
  return [Math.round(value * 10), 10];
}

export function jpegExif(settings: CaptureSettings): Exif {
  const time = exifTimeFields(settings.captureTimeMs, settings.utcOffsetMinutes);
  const [expNum, expDen] = exposureTimeRational(settings.exposureTimeS);
  const [fNum, fDen] = tenthsRational(settings.fNumber);
  const [flNum, flDen] = tenthsRational(settings.focalLengthMm);
  return {
    IFD0: { DateTime: time.dateTime },
    IFD2: {
      DateTimeOriginal: time.dateTime,
      SubSecTimeOriginal: time.subSec,
      OffsetTimeOriginal: time.offset,
      ExposureTime: `${expNum}/${expDen}`,
      FNumber: `${fNum}/${fDen}`,
      ISOSpeedRatings: String(settings.iso),
      FocalLength: `${flNum}/${flDen}`,
      BodySerialNumber: settings.bodySerial,
      ColorSpace: '1',
    },
  };
}

/**
 * libvips always writes ExifVersion 0210, but OffsetTimeOriginal (EXIF 2.31) and
 * BodySerialNumber (EXIF 2.3) need a newer one; this patches the 4-byte value in place.
 */
export function withExifVersion(jpeg: Buffer, version: '0232'): Buffer {
  const patched = Buffer.from(jpeg);
  for (const bigEndian of [true, false]) {
    const entry = Buffer.alloc(12);
    if (bigEndian) {
      entry.writeUInt16BE(0x9000, 0);
      entry.writeUInt16BE(7, 2);
      entry.writeUInt32BE(4, 4);
    } else {
      entry.writeUInt16LE(0x9000, 0);
      entry.writeUInt16LE(7, 2);
      entry.writeUInt32LE(4, 4);
    }
    entry.write('0210', 8, 'latin1');
    const at = patched.indexOf(entry);
    if (at >= 0 && at < 65536) {
      patched.write(version, at + 8, 'latin1');
      return patched;
    }
  }
  return patched;
}

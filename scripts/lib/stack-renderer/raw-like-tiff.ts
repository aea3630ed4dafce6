import { exifTimeFields, exposureTimeRational, tenthsRational, type CaptureSettings } from './capture-metadata';

/**
 * A "raw-like" companion file: a little-endian baseline TIFF 6.0 with the full RGB picture
 * (uncompressed, like many raw formats' main image), an EXIF IFD with the capture metadata, and a
 * reduced-resolution copy in IFD1 — the layout RAW formats built on TIFF share. libvips cannot write EXIF into TIFF, hence this
 * writer. Tag numbers: TIFF 6.0 (Adobe, 1992) and EXIF 2.32 (CIPA DC-008-2019).
 */
type Entry = { tag: number; type: 2 | 3 | 4 | 5 | 7; values: number[] | string | Buffer };

const TYPE_SIZE: Record<Entry['type'], number> = { 2: 1, 3: 2, 4: 4, 5: 8, 7: 1 };

function valueBytes(entry: Entry): Buffer {
  if (entry.type === 2) return Buffer.from(`${entry.values as string}\0`, 'latin1');
  if (entry.type === 7) return entry.values as Buffer;
  const values = entry.values as number[];
  const size = TYPE_SIZE[entry.type];
  const count = entry.type === 5 ? values.length / 2 : values.length;
  const bytes = Buffer.alloc(count * size);
  values.forEach((value, i) => {
    if (entry.type === 3) bytes.writeUInt16LE(value, i * 2);
    else bytes.writeUInt32LE(value, i * 4);
  });
  return bytes;
}

function entryCount(entry: Entry): number {
  if (entry.type === 2) return Buffer.byteLength(entry.values as string, 'latin1') + 1;
  if (entry.type === 7) return (entry.values as Buffer).length;
  const values = entry.values as number[];
  return entry.type === 5 ? values.length / 2 : values.length;
}

/** Lays out one IFD at `offset`; values longer than 4 bytes follow it. */
function encodeIfd(entries: Entry[], offset: number, nextIfdOffset: number): Buffer {
  const sorted = [...entries].sort((a, b) => a.tag - b.tag);
  const tableSize = 2 + sorted.length * 12 + 4;
  const table = Buffer.alloc(tableSize);
  const extras: Buffer[] = [];
  let extraOffset = offset + tableSize;
  table.writeUInt16LE(sorted.length, 0);
  sorted.forEach((entry, i) => {
    const at = 2 + i * 12;
    const bytes = valueBytes(entry);
    table.writeUInt16LE(entry.tag, at);
    table.writeUInt16LE(entry.type, at + 2);
    table.writeUInt32LE(entryCount(entry), at + 4);
    if (bytes.length <= 4) {
      bytes.copy(table, at + 8);
    } else {
      table.writeUInt32LE(extraOffset, at + 8);
      const padded = bytes.length % 2 ? Buffer.concat([bytes, Buffer.alloc(1)]) : bytes;
      extras.push(padded);
      extraOffset += padded.length;
    }
  });
  table.writeUInt32LE(nextIfdOffset, tableSize - 4);
  return Buffer.concat([table, ...extras]);
}

function ifdSize(entries: Entry[]): number {
  return encodeIfd(entries, 0, 0).length;
}

export interface RawLikeInput {
  rgb: Buffer;
  widthPx: number;
  heightPx: number;
  settings: CaptureSettings;
  /** 8-bit RGB of the reduced-resolution copy */
  thumbnailRgb: Buffer;
  thumbnailWidthPx: number;
  thumbnailHeightPx: number;
}

export function writeRawLikeTiff(input: RawLikeInput): Buffer {
  const { rgb, widthPx, heightPx, settings, thumbnailRgb, thumbnailWidthPx, thumbnailHeightPx } = input;
  if (thumbnailRgb.length !== thumbnailWidthPx * thumbnailHeightPx * 3) throw new Error('raw-like TIFF: thumbnail does not match its size');
  if (rgb.length !== widthPx * heightPx * 3) throw new Error('raw-like TIFF: pixel buffer does not match its size');
  const strip = rgb;
  const time = exifTimeFields(settings.captureTimeMs, settings.utcOffsetMinutes);
  const exifEntries: Entry[] = [
    { tag: 0x829a, type: 5, values: exposureTimeRational(settings.exposureTimeS) },
    { tag: 0x829d, type: 5, values: tenthsRational(settings.fNumber) },
    { tag: 0x8827, type: 3, values: [settings.iso] },
    { tag: 0x9000, type: 7, values: Buffer.from('0232', 'latin1') },
    { tag: 0x9003, type: 2, values: time.dateTime },
    { tag: 0x9011, type: 2, values: time.offset },
    { tag: 0x9291, type: 2, values: time.subSec },
    { tag: 0x920a, type: 5, values: tenthsRational(settings.focalLengthMm) },
    { tag: 0xa000, type: 7, values: Buffer.from('0100', 'latin1') },
    { tag: 0xa001, type: 3, values: [1] },
    { tag: 0xa431, type: 2, values: settings.bodySerial },
  ];
  const ifd0Entries = (stripOffset: number, exifOffset: number): Entry[] => [
    { tag: 0x00fe, type: 4, values: [0] },
    { tag: 0x0100, type: 4, values: [widthPx] },
    { tag: 0x0101, type: 4, values: [heightPx] },
    { tag: 0x0102, type: 3, values: [8, 8, 8] },
    { tag: 0x0103, type: 3, values: [1] },
    { tag: 0x0106, type: 3, values: [2] },
    { tag: 0x0111, type: 4, values: [stripOffset] },
    { tag: 0x0112, type: 3, values: [settings.orientation] },
    { tag: 0x0115, type: 3, values: [3] },
    { tag: 0x0116, type: 4, values: [heightPx] },
    { tag: 0x0117, type: 4, values: [strip.length] },
    { tag: 0x011a, type: 5, values: [300, 1] },
    { tag: 0x011b, type: 5, values: [300, 1] },
    { tag: 0x011c, type: 3, values: [1] },
    { tag: 0x0128, type: 3, values: [2] },
    { tag: 0x0132, type: 2, values: time.dateTime },
    { tag: 0x8769, type: 4, values: [exifOffset] },
  ];
  const ifd1Entries = (thumbOffset: number): Entry[] => [
    { tag: 0x00fe, type: 4, values: [1] },
    { tag: 0x0100, type: 4, values: [thumbnailWidthPx] },
    { tag: 0x0101, type: 4, values: [thumbnailHeightPx] },
    { tag: 0x0102, type: 3, values: [8, 8, 8] },
    { tag: 0x0103, type: 3, values: [1] },
    { tag: 0x0106, type: 3, values: [2] },
    { tag: 0x0111, type: 4, values: [thumbOffset] },
    { tag: 0x0115, type: 3, values: [3] },
    { tag: 0x0116, type: 4, values: [thumbnailHeightPx] },
    { tag: 0x0117, type: 4, values: [thumbnailRgb.length] },
    { tag: 0x011c, type: 3, values: [1] },
  ];
  const ifd0Offset = 8;
  const ifd0Length = ifdSize(ifd0Entries(0, 0));
  const exifOffset = ifd0Offset + ifd0Length;
  const exifLength = ifdSize(exifEntries);
  const ifd1Offset = exifOffset + exifLength;
  const ifd1Length = ifdSize(ifd1Entries(0));
  const thumbOffset = ifd1Offset + ifd1Length;
  const stripOffset = thumbOffset + thumbnailRgb.length + (thumbnailRgb.length % 2);
  const header = Buffer.from([0x49, 0x49, 42, 0, ifd0Offset, 0, 0, 0]);
  return Buffer.concat([
    header,
    encodeIfd(ifd0Entries(stripOffset, exifOffset), ifd0Offset, ifd1Offset),
    encodeIfd(exifEntries, exifOffset, 0),
    encodeIfd(ifd1Entries(thumbOffset), ifd1Offset, 0),
    thumbnailRgb,
    Buffer.alloc(thumbnailRgb.length % 2),
    strip,
  ]);
}

import { open, type FileHandle } from 'node:fs/promises';

// RAW containers (TIFF-based, ISO-BMFF-based and others) carry one or more ordinary JPEG
// previews beside the sensor data. Rather than learn each container, scan the file for JPEG
// streams: SOI (FF D8 FF), marker segments up to SOS with a baseline/extended/progressive SOF
// giving the size, then entropy-coded data until EOI (FF D9). Inside entropy-coded data an FF is
// always followed by 00 or a restart marker (ITU-T T.81 §B.1.1.5), so the first FF D9 after SOS
// ends the stream. Reads are positioned and chunked: memory stays at a few MiB whatever the file.

export interface EmbeddedJpeg {
  offset: number;
  length: number;
  widthPx: number;
  heightPx: number;
}

const CHUNK_BYTES = 1 << 20;
const MAX_HEADER_SEGMENTS = 200;
const MAX_JPEG_BYTES = 64 << 20;
const MIN_EDGE_PX = 32;
// SOF0 baseline, SOF1 extended sequential, SOF2 progressive (Huffman). SOF3 (lossless) is sensor
// data in many RAW files, not a picture a browser could show.
const PICTURE_SOF = new Set([0xc0, 0xc1, 0xc2]);
const OTHER_SOF = new Set([0xc3, 0xc5, 0xc6, 0xc7, 0xc9, 0xca, 0xcb, 0xcd, 0xce, 0xcf]);

async function readAt(file: FileHandle, position: number, length: number): Promise<Buffer> {
  const buffer = Buffer.alloc(length);
  const { bytesRead } = await file.read(buffer, 0, length, position);
  return buffer.subarray(0, bytesRead);
}

interface JpegHeader {
  widthPx: number;
  heightPx: number;
  scanStart: number;
}

async function parseHeader(file: FileHandle, offset: number, fileBytes: number): Promise<JpegHeader | null> {
  let position = offset + 2;
  let size: { widthPx: number; heightPx: number } | null = null;
  for (let segment = 0; segment < MAX_HEADER_SEGMENTS && position + 4 <= fileBytes; segment += 1) {
    const head = await readAt(file, position, 4);
    if (head.length < 4 || head[0] !== 0xff) return null;
    const marker = head[1];
    if (marker === 0xff) {
      position += 1; // fill byte
      continue;
    }
    const segmentLength = head.readUInt16BE(2);
    if (segmentLength < 2) return null;
    if (marker === 0xda) {
      return size ? { ...size, scanStart: position + 2 + segmentLength } : null;
    }
    if (OTHER_SOF.has(marker) || marker === 0xd9) return null;
    if (PICTURE_SOF.has(marker)) {
      const frame = await readAt(file, position + 4, 6);
      if (frame.length < 6) return null;
      const heightPx = frame.readUInt16BE(1);
      const widthPx = frame.readUInt16BE(3);
      const components = frame[5];
      if (heightPx < MIN_EDGE_PX || widthPx < MIN_EDGE_PX || (components !== 1 && components !== 3)) return null;
      size = { widthPx, heightPx };
    }
    position += 2 + segmentLength;
  }
  return null;
}

async function findEndOfImage(file: FileHandle, from: number, fileBytes: number): Promise<number | null> {
  const limit = Math.min(fileBytes, from + MAX_JPEG_BYTES);
  for (let position = from; position < limit; position += CHUNK_BYTES - 1) {
    const chunk = await readAt(file, position, Math.min(CHUNK_BYTES, limit - position));
    const at = chunk.indexOf(Buffer.from([0xff, 0xd9]));
    if (at >= 0) return position + at + 2;
    if (chunk.length < CHUNK_BYTES) return null;
  }
  return null;
}

const SOI = Buffer.from([0xff, 0xd8, 0xff]);

/** Every complete JPEG picture stream in the file (outermost ones only), in file order. */
export async function findEmbeddedJpegs(path: string): Promise<EmbeddedJpeg[]> {
  const file = await open(path, 'r');
  try {
    const { size: fileBytes } = await file.stat();
    const found: EmbeddedJpeg[] = [];
    let position = 0;
    while (position + SOI.length <= fileBytes) {
      const chunk = await readAt(file, position, Math.min(CHUNK_BYTES, fileBytes - position));
      const at = chunk.indexOf(SOI);
      if (at < 0) {
        position += Math.max(1, chunk.length - (SOI.length - 1));
        continue;
      }
      const offset = position + at;
      const header = await parseHeader(file, offset, fileBytes);
      const end = header ? await findEndOfImage(file, header.scanStart, fileBytes) : null;
      if (header && end) {
        found.push({ offset, length: end - offset, widthPx: header.widthPx, heightPx: header.heightPx });
        position = end;
      } else {
        position = offset + 1;
      }
    }
    return found;
  } finally {
    await file.close();
  }
}

export async function readEmbeddedJpeg(path: string, jpeg: EmbeddedJpeg): Promise<Buffer> {
  const file = await open(path, 'r');
  try {
    return await readAt(file, jpeg.offset, jpeg.length);
  } finally {
    await file.close();
  }
}

// What an uploaded file is, decided from its first bytes only; its name has no say.
import { fileTypeFromBuffer } from 'file-type/core';

/** Leading bytes needed: file-type's own detection window (its `reasonableDetectionSizeInBytes`). */
export const SNIFF_BYTES = 4100;

export type ImageKind = 'jpeg' | 'tiff-raw' | 'dng' | 'heif' | 'bmff-raw' | 'png';
export type SniffRefusalCode = 'empty' | 'text' | 'executable' | 'archive' | 'other-format' | 'unrecognised';

export type SniffResult =
  /** 'tiff-raw' is any TIFF container; isRaw says whether it holds sensor data or a finished picture. */
  | { ok: true; kind: ImageKind; mime: string; isRaw: boolean }
  | { ok: false; code: SniffRefusalCode; reason: string };

const REFUSAL_PREFIX = 'not an image Lamella accepts: ';
// Raw formats have no brand-free registered media type; a download gets the generic one.
const RAW_MIME = 'application/octet-stream';

// TIFF 6.0 specification, section 2 (Image File Header): "II" + 42 little-endian, "MM" + 42 big-endian.
const TIFF_HEADERS = [[0x49, 0x49, 0x2a, 0x00], [0x4d, 0x4d, 0x00, 0x2a]];
// TIFF-structured raw files that change the 42 to their own magic (from the brief; from memory:
// "IIRS" and "MMOR" are older and big-endian forms of the same family as "IIRO").
const RAW_TIFF_VARIANT_HEADERS = [[0x49, 0x49, 0x52, 0x4f], [0x49, 0x49, 0x52, 0x53], [0x4d, 0x4d, 0x4f, 0x52], [0x49, 0x49, 0x55, 0x00]];
// ISO/IEC 14496-12 `ftyp` brands (HEIF: ISO/IEC 23008-12; AVIF: AV1 Image File Format spec).
const HEIF_BRANDS = new Set(['heic', 'heix', 'heim', 'heis', 'hevc', 'hevx', 'mif1', 'msf1', 'avif', 'avis']);
const RAW_BMFF_BRANDS = new Set(['crx ']);

const TAG_NEW_SUBFILE_TYPE = 254;
const TAG_PHOTOMETRIC = 262;
const TAG_SUB_IFDS = 330;
const TAG_DNG_VERSION = 50706; // DNG specification 1.4, "DNGVersion" (exiftool confirms it in the test)
const PHOTOMETRIC_CFA = 32803; // TIFF/EP: colour filter array, i.e. sensor data
const PHOTOMETRIC_LINEAR_RAW = 34892; // DNG specification 1.4, "LinearRaw" (from memory)

const EXECUTABLE_MIMES = new Set([
  'application/x-elf', 'application/x-mach-binary', 'application/x-msdownload', 'application/java-vm',
  'application/wasm', 'application/x-sharedlib',
]);
const ARCHIVE_EXTENSIONS = new Set(['zip', 'tar', 'rar', 'gz', 'bz2', '7z', 'xz', 'zst', 'lz', 'lz4', 'lzh', 'cab', 'deb', 'rpm', 'ar', 'cpio', 'arj', 'ace', 'tar.gz', 'Z']);

function startsWith(bytes: Uint8Array, signature: number[], offset = 0): boolean {
  if (bytes.length < offset + signature.length) return false;
  return signature.every((b, i) => bytes[offset + i] === b);
}

function ascii(bytes: Uint8Array, start: number, length: number): string {
  return String.fromCharCode(...bytes.subarray(start, start + length));
}

function refuse(code: SniffRefusalCode, what: string): SniffResult {
  return { ok: false, code, reason: REFUSAL_PREFIX + what };
}

/** ftyp box at the start (ISO/IEC 14496-12 §4.3): size, 'ftyp', major brand, minor version, compatible brands. */
function bmffKind(bytes: Uint8Array): SniffResult | null {
  if (bytes.length < 16 || ascii(bytes, 4, 4) !== 'ftyp') return null;
  const boxSize = ((bytes[0] << 24) | (bytes[1] << 16) | (bytes[2] << 8) | bytes[3]) >>> 0;
  const end = Math.min(boxSize >= 16 ? boxSize : 16, bytes.length);
  const brands = [ascii(bytes, 8, 4)];
  for (let offset = 16; offset + 4 <= end; offset += 4) brands.push(ascii(bytes, offset, 4));
  if (RAW_BMFF_BRANDS.has(brands[0])) return { ok: true, kind: 'bmff-raw', mime: RAW_MIME, isRaw: true };
  if (brands.some((b) => HEIF_BRANDS.has(b))) {
    const isAvif = brands[0] === 'avif' || brands[0] === 'avis';
    return { ok: true, kind: 'heif', mime: isAvif ? 'image/avif' : brands[0].startsWith('he') ? 'image/heic' : 'image/heif', isRaw: false };
  }
  return null; // a video or another BMFF file: file-type names it
}

interface IfdSummary { dng: boolean; sensorData: boolean }

/** Reads IFD0's tags when they lie within the sniffed bytes (TIFF 6.0 §2: 12-byte entries). */
function readIfd0(bytes: Uint8Array): IfdSummary | null {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const little = bytes[0] === 0x49;
  const offset = view.getUint32(4, little);
  if (offset < 8 || offset + 2 > bytes.length) return null;
  const count = view.getUint16(offset, little);
  let dng = false;
  let reducedResolution = false;
  let subIfds = false;
  let photometric = -1;
  for (let i = 0; i < count; i += 1) {
    const entry = offset + 2 + i * 12;
    if (entry + 12 > bytes.length) break;
    const tag = view.getUint16(entry, little);
    const type = view.getUint16(entry + 2, little);
    const value = type === 3 ? view.getUint16(entry + 8, little) : view.getUint32(entry + 8, little);
    if (tag === TAG_DNG_VERSION) dng = true;
    else if (tag === TAG_SUB_IFDS) subIfds = true;
    else if (tag === TAG_NEW_SUBFILE_TYPE) reducedResolution = (value & 1) === 1;
    else if (tag === TAG_PHOTOMETRIC) photometric = value;
  }
  const sensorPhotometric = photometric === PHOTOMETRIC_CFA || photometric === PHOTOMETRIC_LINEAR_RAW;
  // Raw files keep a small preview in IFD0 and the sensor data in a sub-IFD.
  return { dng, sensorData: dng || sensorPhotometric || (subIfds && reducedResolution) };
}

function tiffKind(bytes: Uint8Array, detectedByFileType: { ext: string; mime: string } | undefined): SniffResult | null {
  if (RAW_TIFF_VARIANT_HEADERS.some((h) => startsWith(bytes, h))) return { ok: true, kind: 'tiff-raw', mime: RAW_MIME, isRaw: true };
  if (!TIFF_HEADERS.some((h) => startsWith(bytes, h)) || bytes.length < 8) return null;
  const ifd0 = readIfd0(bytes);
  if (ifd0?.dng || detectedByFileType?.ext === 'dng') return { ok: true, kind: 'dng', mime: RAW_MIME, isRaw: true };
  // file-type names several raw variants of the TIFF container; anything but plain 'tif' is one.
  const rawVariant = detectedByFileType !== undefined && detectedByFileType.ext !== 'tif';
  // Camera raws write IFD0 first; when it lies beyond the sniffed bytes, a picture writer put it
  // after the pixels (as libtiff does), so it is a finished picture.
  if (rawVariant || ifd0?.sensorData) return { ok: true, kind: 'tiff-raw', mime: RAW_MIME, isRaw: true };
  return { ok: true, kind: 'tiff-raw', mime: 'image/tiff', isRaw: false };
}

/** Drops a multi-byte UTF-8 character cut off by the end of the sample. */
function withoutCutCharacter(sample: Uint8Array): Uint8Array {
  let end = sample.length;
  let continuation = 0;
  while (end > 0 && continuation < 3 && (sample[end - 1] & 0xc0) === 0x80) {
    end -= 1;
    continuation += 1;
  }
  return end > 0 && sample[end - 1] >= 0xc0 ? sample.subarray(0, end - 1) : sample;
}

function looksLikeText(bytes: Uint8Array): boolean {
  const sample = bytes.subarray(0, SNIFF_BYTES);
  if (sample.includes(0)) return false;
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(sample);
  } catch {
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(withoutCutCharacter(sample));
    } catch {
      return false;
    }
  }
  let control = 0;
  for (const ch of text) {
    const code = ch.codePointAt(0) as number;
    if (code < 32 && ch !== '\n' && ch !== '\r' && ch !== '\t' && ch !== '\f') control += 1;
  }
  return control <= text.length * 0.01;
}

/**
 * Classifies a file by its first SNIFF_BYTES bytes. Accepted: JPEG, PNG, HEIF/AVIF, TIFF
 * containers (raw or finished), DNG and ISO-BMFF raw files. Everything else is refused with a
 * reason a person can read. A truncated file with a valid start is accepted here; reading its
 * metadata flags it.
 */
export async function sniffImageKind(firstBytes: Uint8Array): Promise<SniffResult> {
  if (firstBytes.length === 0) return { ok: false, code: 'empty', reason: 'empty file' };
  const bytes = firstBytes.subarray(0, SNIFF_BYTES);
  const bmff = bmffKind(bytes);
  if (bmff) return bmff;
  let detected: { ext: string; mime: string } | undefined;
  try {
    detected = await fileTypeFromBuffer(bytes);
  } catch {
    detected = undefined; // a structure cut off by the sample end: our own checks still apply
  }
  const tiff = tiffKind(bytes, detected);
  if (tiff) return tiff;
  if (detected?.ext === 'jpg') return { ok: true, kind: 'jpeg', mime: 'image/jpeg', isRaw: false };
  if (detected?.ext === 'png' || detected?.ext === 'apng') return { ok: true, kind: 'png', mime: 'image/png', isRaw: false };
  if (detected) {
    if (EXECUTABLE_MIMES.has(detected.mime)) return refuse('executable', 'looks like an executable program');
    if (detected.mime.startsWith('text/') || detected.ext === 'xml' || detected.ext === 'rtf') return refuse('text', 'looks like text');
    if (ARCHIVE_EXTENSIONS.has(detected.ext)) return refuse('archive', `looks like an archive (${detected.ext})`);
    return refuse('other-format', `looks like ${detected.ext} (${detected.mime}); accepted are JPEG, PNG, HEIF, TIFF and raw files`);
  }
  if (startsWith(bytes, [0x23, 0x21])) return refuse('executable', 'looks like an executable script');
  if (looksLikeText(bytes)) return refuse('text', 'looks like text');
  return refuse('unrecognised', 'unrecognised content');
}

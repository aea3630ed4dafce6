// Joining the RAW and the picture (JPEG or HEIF) of one exposure into one frame.
// Pure: no I/O; every file ends up in exactly one frame.
import { baseNameOf } from './file-names';
import type { GroupingFrame } from './grouping';

/** One file as the card holds it, with its metadata; isRaw comes from content sniffing, never the name. */
export interface CardFile extends GroupingFrame {
  isRaw: boolean;
}

/**
 * One exposure, ready for groupIntoStacks. With a pair the RAW is primary (it is what the merge
 * uses): id (= primaryFileId), fileName and metadata are the RAW's, each field it lacks taken
 * from the picture.
 */
export interface PairedFrame extends GroupingFrame {
  fileIds: string[];
  primaryFileId: string;
}

export const PAIR_TIME_TOLERANCE_MS = 1000;

function canPair(raw: CardFile, picture: CardFile): boolean {
  const rawBody = raw.bodySerial?.trim() || null;
  const pictureBody = picture.bodySerial?.trim() || null;
  if (rawBody !== null && pictureBody !== null && rawBody !== pictureBody) return false;
  // A file without capture time can still pair by name and body; the name is then the evidence.
  if (raw.captureTimeMs == null || picture.captureTimeMs == null) return true;
  return Math.abs(raw.captureTimeMs - picture.captureTimeMs) <= PAIR_TIME_TOLERANCE_MS;
}

function timeDistanceMs(a: CardFile, b: CardFile): number {
  return a.captureTimeMs == null || b.captureTimeMs == null
    ? PAIR_TIME_TOLERANCE_MS + 1 // prefer a partner whose time is known to match
    : Math.abs(a.captureTimeMs - b.captureTimeMs);
}

function frameOf(primary: CardFile, other?: CardFile): PairedFrame {
  return {
    id: primary.id,
    fileIds: other ? [primary.id, other.id] : [primary.id],
    primaryFileId: primary.id,
    fileName: primary.fileName,
    captureTimeMs: primary.captureTimeMs ?? other?.captureTimeMs ?? null,
    bodySerial: primary.bodySerial ?? other?.bodySerial ?? null,
    fNumber: primary.fNumber ?? other?.fNumber ?? null,
    focalLengthMm: primary.focalLengthMm ?? other?.focalLengthMm ?? null,
    exposureTimeS: primary.exposureTimeS ?? other?.exposureTimeS ?? null,
    iso: primary.iso ?? other?.iso ?? null,
    orientation: primary.orientation ?? other?.orientation ?? null,
  };
}

/**
 * Joins a RAW and a picture (JPEG or HEIF) of the same exposure — same base name ignoring case
 * and folders, same body (an unknown serial matches any), capture times within 1 s — into one
 * frame. Every other file becomes a frame of its own; frames keep the files' input order.
 */
export function pairRawAndJpeg(files: readonly CardFile[]): PairedFrame[] {
  const byBaseName = new Map<string, number[]>();
  files.forEach((file, index) => {
    const key = baseNameOf(file.fileName).toLowerCase();
    const list = byBaseName.get(key);
    if (list) list.push(index);
    else byBaseName.set(key, [index]);
  });
  const partnerOf = new Int32Array(files.length).fill(-1); // raw <-> picture, both ways
  for (const indices of byBaseName.values()) {
    if (indices.length < 2) continue;
    for (const rawIndex of indices) {
      if (!files[rawIndex].isRaw) continue;
      let best = -1;
      for (const pictureIndex of indices) {
        const picture = files[pictureIndex];
        if (picture.isRaw || partnerOf[pictureIndex] >= 0 || !canPair(files[rawIndex], picture)) continue;
        if (best < 0 || timeDistanceMs(files[rawIndex], picture) < timeDistanceMs(files[rawIndex], files[best])) best = pictureIndex;
      }
      if (best >= 0) {
        partnerOf[rawIndex] = best;
        partnerOf[best] = rawIndex;
      }
    }
  }
  const frames: PairedFrame[] = [];
  files.forEach((file, index) => {
    const partner = partnerOf[index];
    if (partner < 0) frames.push(frameOf(file));
    else if (partner > index) frames.push(file.isRaw ? frameOf(file, files[partner]) : frameOf(files[partner], file));
  });
  return frames;
}

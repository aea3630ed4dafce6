// What the sessions API answers, as the client reads it (the server builds these shapes in
// server/services/session-service.ts, card-import-service.ts and sorting-view-service.ts).
import type { StackState } from './sessions';

export interface SessionRow {
  id: string;
  title: string;
  shootDate: string;
  subject: string;
  location: string;
  notes: string;
  frameCount: number;
  stackCount: number;
  looseCount: number;
  updatedAt: string;
}

export type PreviewStatus = 'pending' | 'done' | 'failed';

export interface FrameView {
  id: string;
  fileName: string;
  captureTimeMs: number | null;
  /** The camera's UTC offset at capture (OffsetTimeOriginal), when it recorded one. */
  captureOffsetMinutes: number | null;
  fNumber: number | null;
  focalLengthMm: number | null;
  exposureTimeS: number | null;
  iso: number | null;
  orientation: number | null;
  bodySerial: string | null;
  fileNumber: number | null;
  excluded: boolean;
  flags: string[];
  /** Codes of the stack checks that mark this frame (exposure-jump, focus-gap, …), from the latest run. */
  checkCodes: string[];
  previewStatus: PreviewStatus | string;
  previewError: string | null;
  files: { id: string; name: string; kind: string; isRaw: boolean; sizeBytes: number }[];
}

export interface StackView {
  id: string;
  name: string;
  state: StackState;
  position: number;
  startReason: string;
  planId: string | null;
  version: number;
  frames: FrameView[];
}

export interface SortingView {
  sessionId: string;
  groupingOptions: { gapFactor: number; minGapS: number; maxGapS: number; minStackSize: number };
  undoLabel: string | null;
  stacks: StackView[];
  loose: FrameView[];
  fileCount: number;
}

export interface CardImportView {
  id: string;
  sessionId: string;
  createdAt: string;
  completedAt: string | null;
  expectedFiles: number | null;
  storedCount: number;
  duplicateCount: number;
  refusedCount: number;
}

export type FileOutcome =
  | { name: string; status: 'stored'; fileId: string; sha256: string; flags: string[] }
  | { name: string; status: 'duplicate'; fileId: string; sha256: string }
  | { name: string; status: 'refused'; reason: string };

/** Metadata read from a stored file (see server/lib/metadata.ts); every field may be missing. */
export interface StoredFileMetadata {
  exposureTimeS?: number | null;
  fNumber?: number | null;
  iso?: number | null;
  focalLengthMm?: number | null;
  bodySerial?: string | null;
  widthPx?: number | null;
  heightPx?: number | null;
  captureTimeSource?: string;
  /** The camera's UTC offset at capture, in minutes (OffsetTimeOriginal). */
  offsetMinutes?: number | null;
}

export interface SessionFileView {
  id: string;
  name: string;
  originalName: string;
  kind: string;
  isRaw: boolean;
  sizeBytes: number;
  sha256: string;
  captureTimeMs: number | null;
  frameId: string | null;
  flags: string[];
  metadata: StoredFileMetadata;
}

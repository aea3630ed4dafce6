// What the stack page, contact sheet and bundle routes answer (built in server/services/
// stack-detail-service.ts and bundle-service.ts), as the client reads it.
import { z } from 'zod';
import type { StackState } from './sessions';

export const JOB_STATUSES = ['queued', 'running', 'done', 'failed'] as const;
export type JobStatus = (typeof JOB_STATUSES)[number];
export const BUNDLE_KINDS = ['stack', 'session'] as const;
export type BundleKind = (typeof BUNDLE_KINDS)[number];

/** Session bundles hold the stacks a person has checked: every state past draft. */
export const SESSION_BUNDLE_STATES: readonly StackState[] = ['ready', 'handed-off', 'merged', 'archived'];

/** Bundle and sheet requests carry no options; anything sent is refused, not ignored silently. */
export const bundleRequestSchema = z.object({}).strict();

export interface BundleView {
  id: string;
  kind: BundleKind;
  status: JobStatus;
  /** 0 … 100 */
  progress: number;
  error: string | null;
  sessionId: string;
  stackId: string | null;
  stackVersion: number | null;
  /** { stackId: version } of each stack the bundle holds. */
  stackVersions: Record<string, number>;
  /** A stack in it changed (or was removed) since the bundle was requested. */
  stale: boolean;
  fileName: string;
  bytes: number | null;
  createdAt: string;
  finishedAt: string | null;
}

export interface ContactSheetView {
  /** 'none' until someone asks for the sheet of this version. */
  status: JobStatus | 'none';
  stackVersion: number;
  error: string | null;
  /** Frames drawn as grey cells because their preview was missing. */
  missingPreviews: number;
  pages: number | null;
  widthPx: number | null;
  heightPx: number | null;
}

export interface StackFrameView {
  id: string;
  /** 1-based place in the stack, excluded frames included. */
  number: number;
  /** The number in the bundle's file names and on the contact sheet; null when excluded. */
  bundleNumber: number | null;
  fileName: string;
  captureTimeMs: number | null;
  /** The camera's UTC offset at capture (OffsetTimeOriginal), when it recorded one. */
  captureOffsetMinutes: number | null;
  exposureTimeS: number | null;
  fNumber: number | null;
  iso: number | null;
  focalLengthMm: number | null;
  excluded: boolean;
  flags: string[];
  /** Check codes drawn on the contact sheet for this frame. */
  checkCodes: string[];
  previewStatus: string;
  previewError: string | null;
  files: { name: string; kind: string; isRaw: boolean; sizeBytes: number }[];
}

export interface StackDetailView {
  id: string;
  name: string;
  state: StackState;
  version: number;
  session: { id: string; title: string; shootDate: string };
  plan: { id: string; name: string } | null;
  counts: { frames: number; included: number; excluded: number; flagged: number; previewsPending: number; bytes: number };
  frames: StackFrameView[];
  contactSheet: ContactSheetView;
  latestBundle: BundleView | null;
  handedTo: { userId: string | null; name: string | null; email: string | null; at: string | null } | null;
}

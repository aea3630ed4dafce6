// Hand-off of a stack to a retoucher: the request bodies, and the views the API answers with.
import { z } from 'zod';
import { emailSchema } from './auth';
import type { StackState } from './sessions';

export const SHARE_LINK_DEFAULT_DAYS = 7;
export const SHARE_LINK_MAX_DAYS = 30;

export const expiryDaysSchema = z
  .number({ error: 'Give the link’s life in whole days.' })
  .int('Give the link’s life in whole days.')
  .min(1, 'A share link lives at least 1 day.')
  .max(SHARE_LINK_MAX_DAYS, `A share link lives at most ${SHARE_LINK_MAX_DAYS} days.`);

export const handOffSchema = z.discriminatedUnion('to', [
  z.object({ to: z.literal('member'), retoucherUserId: z.uuid('Pick one of the studio’s retouchers.') }),
  z.object({ to: z.literal('email'), email: emailSchema, expiryDays: expiryDaysSchema.default(SHARE_LINK_DEFAULT_DAYS) }),
], { error: 'Say whom to hand the stack to: a retoucher of the studio, or an e-mail address.' });

export const shareLinkCreateSchema = z.object({ expiryDays: expiryDaysSchema.default(SHARE_LINK_DEFAULT_DAYS) });

export type HandOffInput = z.input<typeof handOffSchema>;

export type ShareLinkStatus = 'active' | 'expired' | 'revoked';

export interface ShareLinkView {
  id: string;
  email: string;
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  downloadCount: number;
  lastDownloadAt: string | null;
  status: ShareLinkStatus;
}

/** Answered once, when a link is made: the token itself is never stored or shown again. */
export interface NewShareLink extends ShareLinkView {
  url: string;
}

export type MergedPreviewStatus = 'pending' | 'done' | 'failed';

export interface MergedResultView {
  id: string;
  originalName: string;
  sizeBytes: number;
  mime: string;
  uploadedBy: string;
  uploadedAt: string;
  previewStatus: MergedPreviewStatus;
  previewError: string | null;
  widthPx: number | null;
  heightPx: number | null;
}

export interface StackEventView {
  action: string;
  actor: string;
  detail: Record<string, unknown>;
  at: string;
}

export interface HandedTo {
  kind: 'member' | 'email';
  userId: string | null;
  name: string;
  email: string;
}

export interface HandoffView {
  stack: {
    id: string;
    sessionId: string;
    sessionTitle: string;
    name: string;
    state: StackState;
    version: number;
    frameCount: number;
    handedTo: HandedTo | null;
    handedOffAt: string | null;
    mergedAt: string | null;
  };
  /** What the person asking may do now; the server checks again on each request. */
  can: { handOff: boolean; takeBack: boolean; archive: boolean; uploadMerged: boolean; manageLinks: boolean };
  retouchers: { userId: string; name: string; email: string }[];
  shareLinks: ShareLinkView[];
  mergedResult: MergedResultView | null;
  events: StackEventView[];
}

export interface MyHandoffRow {
  stackId: string;
  stackName: string;
  state: StackState;
  version: number;
  sessionId: string;
  sessionTitle: string;
  shootDate: string;
  frameCount: number;
  handedOffAt: string | null;
  handedOffBy: string;
  mergedAt: string | null;
  contactSheetAvailable: boolean;
  bundle: { status: BundleAvailability; sizeBytes: number | null };
  mergedResult: MergedResultView | null;
}

export type BundleAvailability = 'ready' | 'preparing' | 'none';

export interface SharePageView {
  stackName: string;
  studioName: string;
  sessionTitle: string;
  shootDate: string;
  state: StackState;
  frameCount: number;
  email: string;
  expiresAt: string;
  downloadCount: number;
  contactSheetAvailable: boolean;
  bundle: { status: BundleAvailability; sizeBytes: number | null };
  mergedResult: { originalName: string; sizeBytes: number; uploadedAt: string } | null;
  canUploadMerged: boolean;
}

// The merged result a retoucher sends back: checked by content (a JPEG or TIFF picture only),
// stored, attached to the stack, which moves to merged; the worker makes its previews and the
// person who handed the stack off is told.
import { getDataSource } from '../lib/data-source';
import { enqueue } from '../lib/queues';
import { logger } from '../lib/logger';
import { NotFound } from '../lib/errors';
import type { ReceivedCardFile } from '../lib/card-upload';
import { MergedResult } from '../entities/handoff';
import { Stack } from '../entities/session';
import type { MergedResultView } from '../../shared/schemas/handoff';
import { fieldError } from './stack-edit-steps';
import { assertStep, handedOffBy, queueMails, quote, recordHandoffEvent, appUrl, sizeText, withLockedStack, type HandoffActor } from './handoff-steps';

export type UploadedMerged = ReceivedCardFile & { originalname?: string };

const ACCEPTED = 'Send the merged picture as a JPEG or TIFF file.';

/** What kind of merged file this is, or a 422 on the "file" field saying why it is refused. */
function mergedKind(file: UploadedMerged | undefined): { mime: 'image/jpeg' | 'image/tiff'; ext: 'jpg' | 'tif' } {
  if (!file) throw fieldError('file', `No file came with the upload. ${ACCEPTED}`);
  if (file.outcome === 'refused' || !file.sniff) throw fieldError('file', `The file was refused: ${file.reason ?? 'unreadable'}. ${ACCEPTED}`);
  const { kind, isRaw } = file.sniff;
  if (kind === 'jpeg') return { mime: 'image/jpeg', ext: 'jpg' };
  if (kind === 'tiff-raw' && !isRaw) return { mime: 'image/tiff', ext: 'tif' };
  const what = isRaw ? 'a camera raw file, not a merged picture' : kind === 'png' ? 'a PNG picture' : kind === 'heif' ? 'a HEIF picture' : `a ${kind} file`;
  throw fieldError('file', `The file is ${what}. ${ACCEPTED}`);
}

export function mergedResultView(r: MergedResult): MergedResultView {
  return {
    id: r.id,
    originalName: r.originalName,
    sizeBytes: r.sizeBytes,
    mime: r.mime,
    uploadedBy: r.uploadedByLabel,
    uploadedAt: r.createdAt.toISOString(),
    previewStatus: r.previewStatus,
    previewError: r.previewError,
    widthPx: r.widthPx,
    heightPx: r.heightPx,
  };
}

export async function latestMergedResult(stackId: string): Promise<MergedResult | null> {
  return getDataSource().getRepository(MergedResult).findOne({ where: { stackId }, order: { createdAt: 'DESC' } });
}

/** Control characters and path parts out of a name a browser sent. */
function cleanName(name: string | undefined): string {
  // eslint-disable-next-line no-control-regex -- removing control characters is the point
  const base = (name ?? '').replace(/[\u0000-\u001f\u007f]/g, '').split(/[\\/]/).pop() ?? '';
  return base.trim().slice(0, 200) || 'merged';
}

/**
 * Attaches an uploaded merged result to a handed-off stack and moves it to merged. The caller has
 * checked who may do it; the state is checked here under the lock. A refused file is discarded.
 */
export async function attachMergedResult(
  studioId: string, stackId: string, actor: HandoffActor, file: UploadedMerged | undefined, via: { shareLinkId: string | null },
): Promise<MergedResultView> {
  let kept = false;
  try {
    const { mime, ext } = mergedKind(file);
    const received = file!;
    const done = await withLockedStack(studioId, stackId, async ({ tx, stack, session }) => {
      assertStep('upload-merged', stack);
      const key = `sessions/${session.id}/merged/${received.put!.sha256}.${ext}`;
      await received.commit!(key);
      kept = true;
      const repo = tx.getRepository(MergedResult);
      const result = await repo.save(repo.create({
        stackId: stack.id, sessionId: session.id, storageKey: key, sha256: received.put!.sha256, sizeBytes: received.put!.sizeBytes, mime,
        originalName: cleanName(received.originalname), uploadedByUserId: actor.userId, uploadedByLabel: actor.label,
        shareLinkId: via.shareLinkId, previewStatus: 'pending', previewError: null, previewSmallKey: null, previewLargeKey: null, widthPx: null, heightPx: null,
      }));
      await tx.getRepository(Stack).update({ id: stack.id }, { state: 'merged', mergedAt: result.createdAt });
      const eventId = await recordHandoffEvent(tx, stack.id, actor, 'merged-uploaded', {
        mergedResultId: result.id, fileName: result.originalName, sizeBytes: result.sizeBytes, mime, ...(via.shareLinkId ? { shareLinkId: via.shareLinkId } : {}),
      });
      return { stack, session, result, eventId };
    });
    try {
      await enqueue('mergedPreview', { mergedResultId: done.result.id }, `merged-preview:${done.result.id}`);
    } catch (err) {
      logger.error({ err, mergedResultId: done.result.id }, 'could not queue the merged preview');
    }
    const photographer = await handedOffBy(done.stack.id);
    if (photographer) {
      await queueMails(done.eventId, [{
        to: photographer.email,
        subject: `Merged result in: ${done.stack.name}`,
        text: `${actor.label} sent back the merged result of ${quote(done.stack.name)} (${done.session.title}): ${done.result.originalName}, ` +
          `${sizeText(done.result.sizeBytes)}.\n\nSee it and archive the stack here:\n${appUrl(`/sessions/${done.session.id}/stacks/${done.stack.id}`)}\n`,
      }]);
    }
    return mergedResultView(done.result);
  } finally {
    if (!kept) await file?.discard?.().catch(() => undefined);
  }
}

export async function mergedResultOf(stackId: string): Promise<MergedResult> {
  const result = await latestMergedResult(stackId);
  if (!result) throw new NotFound('This stack has no merged result yet.');
  return result;
}

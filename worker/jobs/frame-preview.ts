// Small and large previews for one frame (from its picture file, else the RAW's embedded preview,
// else a placeholder), then the frame statistics the stack checks use, read from the large preview.
import type { Job } from 'bullmq';
import { getDataSource } from '../../server/lib/data-source';
import { getStore, storageKeys } from '../../server/lib/storage';
import { Frame, StoredFile } from '../../server/entities/session';
import { makePreviews, type PreviewSourceKind } from '../lib/previews';
import { computeFrameStats } from '../lib/frame-stats';
import { queueChecksForFrame } from '../../server/services/check-results-service';
import { logger } from '../../server/lib/logger';
import type { Payload } from '../queues';

export async function framePreviewJob(job: Job<Payload<'framePreview'>>): Promise<{ source: string }> {
  const { frameId, sessionId } = job.data;
  const ds = getDataSource();
  const frame = await ds.getRepository(Frame).findOneBy({ id: frameId, sessionId });
  if (!frame) return { source: 'gone' }; // re-paired or deleted since it was queued: nothing to do
  const file = await ds.getRepository(StoredFile).findOneByOrFail({ id: frame.pictureFileId ?? frame.primaryFileId });
  const store = getStore();
  const smallKey = storageKeys.preview(sessionId, frameId, 'small');
  const largeKey = storageKeys.preview(sessionId, frameId, 'large');
  await job.updateProgress(10);
  const result = await makePreviews(store.localPath(file.storageKey), {
    kind: file.kind as PreviewSourceKind,
    outSmallPath: await store.localPathForWrite(smallKey),
    outLargePath: await store.localPathForWrite(largeKey),
  });
  await job.updateProgress(60);
  const stats = result.source === 'placeholder' ? null : await computeFrameStats(store.localPath(largeKey));
  await job.updateProgress(90);
  const flags = [...new Set([...frame.flags.filter((f) => f !== 'no-preview' && f !== 'too-large'), ...result.flags])];
  await ds.getRepository(Frame).update(
    { id: frameId },
    { previewStatus: 'done', previewError: null, previewSmallKey: smallKey, previewLargeKey: largeKey, stats, flags },
  );
  await queueChecks(frameId);
  await job.updateProgress(100);
  return { source: result.source };
}

/** After the last retry: leave a readable error on the frame. */
export async function framePreviewFailed(data: Payload<'framePreview'>, err: Error) {
  await getDataSource().getRepository(Frame).update({ id: data.frameId }, { previewStatus: 'failed', previewError: `Preview could not be made: ${err.message}` });
  await queueChecks(data.frameId);
}

/**
 * The last frame of a stack to be measured starts the stack's checks. A failure here must not
 * redo the preview: it is logged, and the stack page queues the checks when it finds them missing.
 */
async function queueChecks(frameId: string) {
  await queueChecksForFrame(frameId).catch((err: unknown) => logger.warn({ frameId, err }, 'could not queue the stack checks'));
}

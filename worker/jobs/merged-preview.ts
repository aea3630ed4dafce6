// Small and large previews of a merged result a retoucher sent back (JPEG or TIFF, often large).
import type { Job } from 'bullmq';
import sharp from 'sharp';
import { getDataSource } from '../../server/lib/data-source';
import { getStore } from '../../server/lib/storage';
import { MergedResult } from '../../server/entities/handoff';
import { makePreviews } from '../lib/previews';
import type { Payload } from '../queues';

export const mergedPreviewKey = (sessionId: string, resultId: string, size: 'small' | 'large') => `sessions/${sessionId}/merged/${resultId}-${size}.jpg`;

export async function mergedPreviewJob(job: Job<Payload<'mergedPreview'>>): Promise<{ source: string }> {
  const repo = getDataSource().getRepository(MergedResult);
  const result = await repo.findOneBy({ id: job.data.mergedResultId });
  if (!result) return { source: 'gone' }; // its stack was deleted since: nothing to do
  const store = getStore();
  const smallKey = mergedPreviewKey(result.sessionId, result.id, 'small');
  const largeKey = mergedPreviewKey(result.sessionId, result.id, 'large');
  await job.updateProgress(10);
  const made = await makePreviews(store.localPath(result.storageKey), {
    kind: result.mime === 'image/jpeg' ? 'jpeg' : 'tiff-raw',
    outSmallPath: await store.localPathForWrite(smallKey),
    outLargePath: await store.localPathForWrite(largeKey),
  });
  await job.updateProgress(90);
  const size = await sharp(store.localPath(result.storageKey), { limitInputPixels: false }).metadata().catch(() => null);
  const unreadable = made.source === 'placeholder';
  await repo.update({ id: result.id }, {
    previewStatus: 'done',
    previewError: unreadable ? 'The merged file could not be decoded; a placeholder stands in for its preview.' : null,
    previewSmallKey: smallKey,
    previewLargeKey: largeKey,
    widthPx: size?.width ?? null,
    heightPx: size?.height ?? null,
  });
  await job.updateProgress(100);
  return { source: made.source };
}

/** After the last retry: leave a readable error on the result. */
export async function mergedPreviewFailed(data: Payload<'mergedPreview'>, err: Error) {
  await getDataSource().getRepository(MergedResult).update({ id: data.mergedResultId }, { previewStatus: 'failed', previewError: `Preview could not be made: ${err.message}` });
}

// Starts one BullMQ worker per registered queue. Used by worker/index.ts and by tests.
import { Worker, type Job } from 'bullmq';
import type { Redis } from 'ioredis';
import { QUEUES, type QueueKey } from './queues';
import { framePreviewFailed, framePreviewJob } from './jobs/frame-preview';
import { stackSheetFailed, stackSheetJob } from './jobs/stack-sheet';
import { bundleFailed, bundleJob } from './jobs/bundle';
import { mailJob } from './jobs/mail';
import { mergedPreviewFailed, mergedPreviewJob } from './jobs/merged-preview';
import { stackChecksJob } from './jobs/stack-checks';
import { logger } from '../server/lib/logger';

type Handler = { run: (job: Job, token?: string) => Promise<unknown>; failed?: (data: never, err: Error) => Promise<void>; concurrency: number };

// Image work is CPU-bound: two at a time on a two-core machine.
export const HANDLERS: Partial<Record<QueueKey, Handler>> = {
  framePreview: { run: framePreviewJob as Handler['run'], failed: framePreviewFailed as Handler['failed'], concurrency: 2 },
  stackSheet: { run: stackSheetJob as Handler['run'], failed: stackSheetFailed as Handler['failed'], concurrency: 1 },
  // Bundles are disk-bound: one at a time keeps reads sequential.
  bundle: { run: bundleJob as Handler['run'], failed: bundleFailed as Handler['failed'], concurrency: 1 },
  mail: { run: mailJob as Handler['run'], concurrency: 4 },
  mergedPreview: { run: mergedPreviewJob as Handler['run'], failed: mergedPreviewFailed as Handler['failed'], concurrency: 1 },
  // Checks read the database and compute for milliseconds.
  stackChecks: { run: stackChecksJob as Handler['run'], concurrency: 2 },
};

// A job whose worker died is taken up again once its lock runs out (BullMQ's stalled-job check).
// LAMELLA_WORKER_LOCK_MS shortens the lock for tests that kill a worker on purpose.
function lockOptions(): { lockDuration?: number; stalledInterval?: number } {
  const lockMs = Number(process.env.LAMELLA_WORKER_LOCK_MS);
  return Number.isFinite(lockMs) && lockMs > 0 ? { lockDuration: lockMs, stalledInterval: Math.max(500, Math.round(lockMs / 2)) } : {};
}

export function startWorkers(connection: Redis): Worker[] {
  return (Object.entries(HANDLERS) as [QueueKey, Handler][]).map(([key, h]) => {
    const def = QUEUES[key];
    const worker = new Worker(
      def.name,
      async (job, token) => {
        job.data = def.payload.parse(job.data);
        return h.run(job, token);
      },
      { connection, concurrency: h.concurrency, ...lockOptions() },
    );
    worker.on('failed', (job, err) => {
      if (!job) return;
      // A job whose workers died more often than maxStalledCount is failed by BullMQ without retries.
      const finalAttempt = job.attemptsMade >= (job.opts.attempts ?? 1) || /stalled more than allowable limit/.test(err.message);
      logger.warn({ queue: def.name, jobId: job.id, attempt: job.attemptsMade, err: err.message }, 'job failed');
      if (finalAttempt && h.failed) h.failed(job.data as never, err).catch((e) => logger.error({ err: e }, 'could not record job failure'));
    });
    return worker;
  });
}

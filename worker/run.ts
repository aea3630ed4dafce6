// Starts one BullMQ worker per registered queue. Used by worker/index.ts and by tests.
import { Worker, type Job } from 'bullmq';
import type { Redis } from 'ioredis';
import { QUEUES, type QueueKey } from './queues';
import { framePreviewFailed, framePreviewJob } from './jobs/frame-preview';
import { logger } from '../server/lib/logger';

type Handler = { run: (job: Job) => Promise<unknown>; failed?: (data: never, err: Error) => Promise<void>; concurrency: number };

// Image work is CPU-bound: two at a time on a two-core machine.
export const HANDLERS: Partial<Record<QueueKey, Handler>> = {
  framePreview: { run: framePreviewJob as Handler['run'], failed: framePreviewFailed as Handler['failed'], concurrency: 2 },
};

export function startWorkers(connection: Redis): Worker[] {
  return (Object.entries(HANDLERS) as [QueueKey, Handler][]).map(([key, h]) => {
    const def = QUEUES[key];
    const worker = new Worker(
      def.name,
      async (job) => {
        job.data = def.payload.parse(job.data);
        return h.run(job);
      },
      { connection, concurrency: h.concurrency },
    );
    worker.on('failed', (job, err) => {
      if (!job) return;
      const finalAttempt = job.attemptsMade >= (job.opts.attempts ?? 1);
      logger.warn({ queue: def.name, jobId: job.id, attempt: job.attemptsMade, err: err.message }, 'job failed');
      if (finalAttempt && h.failed) h.failed(job.data as never, err).catch((e) => logger.error({ err: e }, 'could not record job failure'));
    });
    return worker;
  });
}

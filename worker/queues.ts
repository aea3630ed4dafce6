// The one registry of queues and their payloads. The API enqueues through server/lib/queues.ts;
// the worker consumes in worker/jobs/. Payloads are parsed with these schemas on both sides.
import { z } from 'zod';

export const QUEUES = {
  framePreview: {
    name: 'frame-preview',
    payload: z.object({ frameId: z.uuid(), sessionId: z.uuid() }),
  },
  stackSheet: {
    name: 'stack-sheet',
    payload: z.object({ stackId: z.uuid(), version: z.number().int().positive() }),
  },
  bundle: {
    name: 'bundle',
    payload: z.object({ bundleId: z.uuid() }),
  },
  mail: {
    name: 'mail',
    payload: z.object({ to: z.string().min(3), subject: z.string().min(1), text: z.string() }),
  },
  mergedPreview: {
    name: 'merged-preview',
    payload: z.object({ mergedResultId: z.uuid() }),
  },
  stackChecks: {
    name: 'stack-checks',
    payload: z.object({ stackId: z.uuid(), version: z.number().int().positive() }),
  },
} as const;

export type QueueKey = keyof typeof QUEUES;
export type Payload<K extends QueueKey> = z.infer<(typeof QUEUES)[K]['payload']>;

/** Retries with exponential backoff: 2 s, 4 s, 8 s, 16 s. */
export const DEFAULT_JOB_OPTIONS = {
  attempts: 5,
  backoff: { type: 'exponential', delay: 2000 },
  removeOnComplete: { age: 24 * 3600, count: 5000 },
  removeOnFail: { age: 7 * 24 * 3600 },
} as const;

// Producers: the API only enqueues. A job id per item version makes enqueueing idempotent.
import { Queue } from 'bullmq';
import { DEFAULT_JOB_OPTIONS, QUEUES, type Payload, type QueueKey } from '../../worker/queues';
import { getRedis } from './redis';

const queues = new Map<QueueKey, Queue>();

export function queueFor(key: QueueKey): Queue {
  let q = queues.get(key);
  if (!q) {
    q = new Queue(QUEUES[key].name, { connection: getRedis(), defaultJobOptions: DEFAULT_JOB_OPTIONS });
    queues.set(key, q);
  }
  return q;
}

export async function enqueue<K extends QueueKey>(key: K, payload: Payload<K>, jobId: string): Promise<void> {
  const data = QUEUES[key].payload.parse(payload);
  // BullMQ job ids may not contain ':'.
  await queueFor(key).add(QUEUES[key].name, data, { jobId: jobId.replaceAll(':', '_') });
}

export async function enqueueMany<K extends QueueKey>(key: K, items: { payload: Payload<K>; jobId: string }[]): Promise<void> {
  if (items.length === 0) return;
  await queueFor(key).addBulk(
    items.map((i) => ({ name: QUEUES[key].name, data: QUEUES[key].payload.parse(i.payload), opts: { ...DEFAULT_JOB_OPTIONS, jobId: i.jobId.replaceAll(':', '_') } })),
  );
}

export async function closeQueues() {
  await Promise.all([...queues.values()].map((q) => q.close()));
  queues.clear();
}

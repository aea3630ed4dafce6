// Runs the BullMQ workers inside the test process, against the test Redis.
import type { Worker } from 'bullmq';

export async function startTestWorkers(): Promise<{ stop: () => Promise<void> }> {
  const { getRedis } = await import('../../server/lib/redis');
  const { startWorkers } = await import('../../worker/run');
  const connection = getRedis().duplicate({ maxRetriesPerRequest: null });
  const workers: Worker[] = startWorkers(connection);
  return {
    stop: async () => {
      await Promise.all(workers.map((w) => w.close()));
      await connection.quit().catch(() => undefined);
    },
  };
}

export async function until<T>(what: string, fn: () => Promise<T | undefined | false>, timeoutMs = 60_000): Promise<T> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

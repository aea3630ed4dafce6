import 'reflect-metadata';
import { afterAll } from 'vitest';

// Close this test file's Redis connections before the global teardown stops redis-server, so
// nothing reconnects to a server that is gone.
afterAll(async () => {
  const { closeQueues } = await import('../../server/lib/queues');
  const { closeRedis } = await import('../../server/lib/redis');
  await closeQueues();
  await closeRedis();
});

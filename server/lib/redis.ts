import { Redis } from 'ioredis';
import { env } from './env';

let client: Redis | undefined;

/** One shared connection; BullMQ needs maxRetriesPerRequest: null on connections it blocks on. */
export function getRedis(): Redis {
  if (!client) {
    client = new Redis(env().REDIS_URL, { maxRetriesPerRequest: null, lazyConnect: false });
  }
  return client;
}

export async function closeRedis(): Promise<void> {
  if (client) {
    await client.quit().catch(() => undefined);
    client = undefined;
  }
}

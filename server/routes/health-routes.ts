import { Router } from 'express';
import { mountRoutes, PUBLIC } from '../lib/route';
import { getDataSource } from '../lib/data-source';
import { getRedis } from '../lib/redis';

async function probe(fn: () => Promise<unknown>): Promise<'up' | 'down'> {
  try {
    await Promise.race([fn(), new Promise((_, reject) => setTimeout(() => reject(new Error('timeout')), 2000))]);
    return 'up';
  } catch {
    return 'down';
  }
}

export function healthRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api', [
    {
      method: 'get', path: '/health', access: PUBLIC,
      handler: async (_req, res) => {
        const [postgres, redis] = await Promise.all([
          probe(() => getDataSource().query('SELECT 1')),
          probe(() => getRedis().ping()),
        ]);
        const ok = postgres === 'up' && redis === 'up';
        res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'degraded', postgres, redis });
      },
    },
  ]);
  return router;
}

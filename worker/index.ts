import 'reflect-metadata';
import { Redis } from 'ioredis';
import { env } from '../server/lib/env';
import { initDataSource, closeDataSource } from '../server/lib/data-source';
import { logger } from '../server/lib/logger';
import { startWorkers } from './run';

await initDataSource();
const connection = new Redis(env().REDIS_URL, { maxRetriesPerRequest: null });
const workers = startWorkers(connection);
logger.info(`Lamella worker running ${workers.length} queues`);

async function stop() {
  await Promise.all(workers.map((w) => w.close()));
  await connection.quit();
  await closeDataSource();
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

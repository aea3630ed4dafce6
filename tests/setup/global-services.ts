// Starts a throw-away PostgreSQL cluster, a redis-server and the mail catcher for one test run,
// runs the migrations on a fresh database, and stops everything afterwards.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { ensureDebianPackages, freePort, startPostgres, startRedis } from '../../scripts/lib/services';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    redisUrl: string;
    smtpUrl: string;
    dataDir: string;
  }
}

export default async function setup(project: TestProject) {
  ensureDebianPackages(['postgresql', 'redis']);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-test-'));
  fs.chmodSync(dataDir, 0o755);
  const pg = await startPostgres({ dataDir, port: await freePort() });
  const redis = await startRedis({ dataDir, port: await freePort() });
  const dbName = `lamella_test_${process.pid}`;
  pg.createDatabase(dbName);
  const databaseUrl = pg.url(dbName);
  const smtpPort = await freePort();
  const smtpUrl = `smtp://127.0.0.1:${smtpPort}`;

  Object.assign(process.env, { DATABASE_URL: databaseUrl, REDIS_URL: redis.url, SMTP_URL: smtpUrl, NODE_ENV: 'test', LAMELLA_DATA_DIR: path.join(dataDir, 'files') });
  const { initDataSource, closeDataSource } = await import('../../server/lib/data-source');
  const ds = await initDataSource();
  await ds.runMigrations({ transaction: 'each' });
  const { startMailCatcher } = await import('../../server/lib/mail-catcher');
  const catcher = await startMailCatcher(smtpPort);

  project.provide('databaseUrl', databaseUrl);
  project.provide('redisUrl', redis.url);
  project.provide('smtpUrl', smtpUrl);
  project.provide('dataDir', dataDir);

  return async () => {
    await new Promise<void>((r) => catcher.close(() => r()));
    await closeDataSource();
    redis.stop();
    pg.stop();
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
}

import { createApp } from './app';
import { env } from './lib/env';
import { initDataSource } from './lib/data-source';
import { logger } from './lib/logger';

await initDataSource();
const app = createApp({ clientDir: process.env.CLIENT_DIR ?? 'dist/client' });
const server = app.listen(env().API_PORT, '127.0.0.1', () => {
  logger.info(`Lamella API listening on http://127.0.0.1:${env().API_PORT}`);
});
for (const sig of ['SIGINT', 'SIGTERM'] as const) {
  process.on(sig, () => server.close(() => process.exit(0)));
}

import { closeDataSource, initDataSource } from '../server/lib/data-source';
import { seedDemo } from './lib/demo-seed';

await initDataSource();
const t0 = Date.now();
const result = await seedDemo({ reset: process.argv.includes('--reset') });
process.stderr.write(`[lamella] demo studio ${result === 'created' ? `created in ${((Date.now() - t0) / 1000).toFixed(1)} s` : 'already present'}\n`);
await closeDataSource();
process.exit(0);

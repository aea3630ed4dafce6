import { initDataSource, closeDataSource } from '../lib/data-source';

const ds = await initDataSource();
const ran = await ds.runMigrations({ transaction: 'each' });
process.stderr.write(`[lamella] migrations: ${ran.length} applied\n`);
await closeDataSource();

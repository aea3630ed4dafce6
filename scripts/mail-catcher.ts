import { initDataSource } from '../server/lib/data-source';
import { startMailCatcher } from '../server/lib/mail-catcher';

const port = Number(new URL(process.env.SMTP_URL ?? 'smtp://127.0.0.1:2525').port || 2525);
await initDataSource();
const server = await startMailCatcher(port);
process.stderr.write(`[lamella] mail catcher on smtp://127.0.0.1:${port}\n`);
for (const sig of ['SIGINT', 'SIGTERM'] as const) process.on(sig, () => server.close(() => process.exit(0)));

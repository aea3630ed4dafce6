// Brings Lamella up on one machine: private PostgreSQL and Redis on loopback (unless DATABASE_URL /
// REDIS_URL are set), migrations, the demo seed, the client build, then API + worker + mail catcher.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { ensureDebianPackages, startPostgres, startRedis, type RunningPostgres, type RunningRedis } from './lib/services';

const args = new Set(process.argv.slice(2));
const dev = args.has('--dev');
const seedOnly = args.has('--seed-only');
const reset = args.has('--reset');
const root = path.resolve(import.meta.dirname, '..');
const dataDir = path.resolve(root, process.env.LAMELLA_DATA_DIR ?? 'data');
const apiPort = Number(process.env.API_PORT ?? 5480);
const children: ChildProcess[] = [];
let pg: RunningPostgres | undefined;
let redis: RunningRedis | undefined;
let stopping = false;

const say = (m: string) => process.stderr.write(`[lamella] ${m}\n`);

function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  say('stopping…');
  for (const c of children) c.kill('SIGTERM');
  setTimeout(() => {
    for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
    redis?.stop();
    pg?.stop();
    process.exit(code);
  }, 1500).unref();
}
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));

function run(name: string, cmd: string, cmdArgs: string[], env: NodeJS.ProcessEnv) {
  const child = spawn(cmd, cmdArgs, { cwd: root, env, stdio: ['ignore', 'inherit', 'inherit'] });
  children.push(child);
  child.on('exit', (code, signal) => {
    if (!stopping) {
      say(`${name} exited (${signal ?? code}); stopping everything.`);
      stopAll(1);
    }
  });
  return child;
}

function sessionSecret(): string {
  if (process.env.SESSION_SECRET) return process.env.SESSION_SECRET;
  const file = path.join(dataDir, 'session-secret');
  if (!fs.existsSync(file)) fs.writeFileSync(file, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

fs.mkdirSync(dataDir, { recursive: true });
fs.chmodSync(dataDir, 0o755);

const env: NodeJS.ProcessEnv = {
  ...process.env,
  NODE_ENV: dev ? 'development' : (process.env.NODE_ENV ?? 'production'),
  API_PORT: String(apiPort),
  PUBLIC_URL: process.env.PUBLIC_URL ?? `http://127.0.0.1:${apiPort}`,
  LAMELLA_DATA_DIR: path.join(dataDir, 'files'),
  SESSION_SECRET: sessionSecret(),
};

if (!process.env.DATABASE_URL) {
  ensureDebianPackages(['postgresql']);
  pg = await startPostgres({ dataDir, port: Number(process.env.LAMELLA_PG_PORT ?? 5499) });
  pg.createDatabase('lamella');
  env.DATABASE_URL = pg.url('lamella');
  say(`PostgreSQL on 127.0.0.1:${pg.port} (data in ${path.join(dataDir, 'pg')})`);
}
if (!process.env.REDIS_URL) {
  ensureDebianPackages(['redis']);
  redis = await startRedis({ dataDir, port: Number(process.env.LAMELLA_REDIS_PORT ?? 6399) });
  env.REDIS_URL = redis.url;
  say(`Redis on 127.0.0.1:${redis.port}`);
}
const ownMailCatcher = !process.env.SMTP_URL;
env.SMTP_URL ??= `smtp://127.0.0.1:${process.env.LAMELLA_SMTP_PORT ?? 2525}`;
env.MAIL_CATCHER = ownMailCatcher ? 'on' : 'off';

const tsx = path.join(root, 'node_modules/.bin/tsx');
const step = (what: string, cmd: string, cmdArgs: string[]) => {
  const res = spawnSync(cmd, cmdArgs, { cwd: root, env, stdio: 'inherit' });
  if (res.status !== 0) {
    say(`${what} failed.`);
    stopAll(1);
    throw new Error(`${what} failed`);
  }
};
step('migrations', tsx, ['server/cli/migrate.ts']);
step('demo seed', tsx, ['scripts/seed-demo.ts', ...(reset ? ['--reset'] : [])]);
if (seedOnly) stopAll(0);
else {
  if (!dev) step('client build', path.join(root, 'node_modules/.bin/vite'), ['build', '--logLevel', 'warn']);
  if (ownMailCatcher) run('mail catcher', tsx, ['scripts/mail-catcher.ts'], env);
  run('API', tsx, [...(dev ? ['watch', '--clear-screen=false'] : []), 'server/index.ts'], env);
  if (fs.existsSync(path.join(root, 'worker/index.ts'))) run('worker', tsx, [...(dev ? ['watch', '--clear-screen=false'] : []), 'worker/index.ts'], env);
  if (dev) run('vite', path.join(root, 'node_modules/.bin/vite'), ['--host', '127.0.0.1'], env);
  const { DEMO_USERS } = await import('./lib/demo-users');
  const url = dev ? `http://127.0.0.1:${process.env.DEV_PORT ?? 5173}` : env.PUBLIC_URL;
  say('');
  say(`Lamella is running: ${url}`);
  say('Demo sign-ins (studio "Fern & Brass Macro Studio"):');
  for (const u of DEMO_USERS) say(`  ${u.role.padEnd(13)} ${u.email.padEnd(34)} ${u.password}`);
  say('Ctrl-C stops everything started here.');
}

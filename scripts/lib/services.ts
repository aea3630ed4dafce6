// Starts the private PostgreSQL cluster and redis-server that `npm start` and `npm test` need.
// Binaries come from Debian's packages; installed on demand when running as root.
import { execFileSync, spawn, spawnSync, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';

const isRoot = process.getuid?.() === 0;

function log(message: string) {
  process.stderr.write(`[lamella] ${message}\n`);
}

function hasCommand(cmd: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' }).status === 0;
}

export function postgresBinDir(): string | null {
  const root = '/usr/lib/postgresql';
  if (!fs.existsSync(root)) return null;
  const versions = fs
    .readdirSync(root)
    .filter((v) => fs.existsSync(path.join(root, v, 'bin', 'initdb')))
    .sort((a, b) => Number(a) - Number(b));
  const latest = versions.at(-1);
  return latest ? path.join(root, latest, 'bin') : null;
}

/** Debian packages that provide each tool; installed with apt-get when missing and we are root. */
const PACKAGE_OF: Record<string, { check: () => boolean; pkg: string[] }> = {
  postgresql: { check: () => postgresBinDir() !== null, pkg: ['postgresql', 'postgresql-contrib'] },
  redis: { check: () => hasCommand('redis-server'), pkg: ['redis-server'] },
  chromium: { check: () => fs.existsSync('/usr/bin/chromium'), pkg: ['chromium'] },
  exiftool: { check: () => hasCommand('exiftool'), pkg: ['libimage-exiftool-perl'] },
  unzip: { check: () => hasCommand('unzip') && hasCommand('zip'), pkg: ['unzip', 'zip'] },
  poppler: { check: () => hasCommand('pdfinfo'), pkg: ['poppler-utils'] },
  imagemagick: { check: () => fs.existsSync('/usr/bin/convert'), pkg: ['imagemagick'] },
  vips: { check: () => hasCommand('vipsthumbnail'), pkg: ['libvips-tools'] },
};
export type Tool = keyof typeof PACKAGE_OF;

export function ensureDebianPackages(tools: Tool[]): void {
  const missing = tools.filter((t) => !PACKAGE_OF[t].check());
  if (missing.length === 0) return;
  const pkgs = missing.flatMap((t) => PACKAGE_OF[t].pkg);
  if (!isRoot) {
    throw new Error(
      `Missing Debian packages: ${pkgs.join(' ')}. Install them (sudo apt-get install -y ${pkgs.join(' ')}) ` +
        'or run this command as root, or set DATABASE_URL / REDIS_URL to servers you already run.',
    );
  }
  log(`installing from Debian: ${pkgs.join(' ')}`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  execFileSync('apt-get', ['update', '-q'], { stdio: ['ignore', 'ignore', 'inherit'], env });
  execFileSync('apt-get', ['install', '-y', '-q', '--no-install-recommends', ...pkgs], {
    stdio: ['ignore', 'ignore', 'inherit'],
    env,
  });
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      srv.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0));
    });
  });
}

async function waitFor(check: () => Promise<boolean> | boolean, what: string, timeoutMs = 20_000) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (await check()) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`Timed out waiting for ${what}`);
}

function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const sock = net.connect(port, '127.0.0.1');
    sock.once('connect', () => {
      sock.destroy();
      resolve(true);
    });
    sock.once('error', () => resolve(false));
  });
}

/** As root, PostgreSQL's own tools must run as the `postgres` user. */
function asPostgres(bin: string, args: string[], opts: { quiet?: boolean } = {}) {
  const cmd = isRoot ? 'runuser' : bin;
  const fullArgs = isRoot ? ['-u', 'postgres', '--', bin, ...args] : args;
  const res = spawnSync(cmd, fullArgs, { encoding: 'utf8' });
  if (res.status !== 0) {
    throw new Error(`${path.basename(bin)} failed: ${res.stderr || res.stdout}`);
  }
  if (!opts.quiet && res.stdout.trim()) log(res.stdout.trim());
  return res.stdout;
}

/** The postgres user must be able to traverse every parent of the data folder. */
function assertPostgresCanReach(dir: string) {
  if (!isRoot) return;
  const res = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir]);
  if (res.status !== 0) {
    throw new Error(
      `The postgres user cannot reach ${dir}. Let it traverse every parent folder ` +
        `(e.g. chmod o+x on each) or set LAMELLA_DATA_DIR to a folder it can reach.`,
    );
  }
}

export interface RunningPostgres {
  url: (database: string) => string;
  port: number;
  createDatabase: (name: string) => void;
  stop: () => void;
}

export async function startPostgres(opts: { dataDir: string; port: number }): Promise<RunningPostgres> {
  const bin = postgresBinDir();
  if (!bin) throw new Error('PostgreSQL binaries not found under /usr/lib/postgresql');
  const clusterDir = path.join(opts.dataDir, 'pg');
  const socketDir = path.join(opts.dataDir, 'pg-socket');
  fs.mkdirSync(clusterDir, { recursive: true, mode: 0o700 });
  fs.mkdirSync(socketDir, { recursive: true });
  if (isRoot) {
    execFileSync('chown', ['-R', 'postgres:postgres', clusterDir, socketDir]);
    assertPostgresCanReach(clusterDir);
  }
  if (!fs.existsSync(path.join(clusterDir, 'PG_VERSION'))) {
    log(`initialising a private PostgreSQL cluster in ${clusterDir}`);
    asPostgres(path.join(bin, 'initdb'), ['-D', clusterDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8'], { quiet: true });
  }
  const logFile = path.join(clusterDir, 'server.log');
  if (await portOpen(opts.port)) {
    throw new Error(`Port ${opts.port} on 127.0.0.1 is already in use; stop what runs there or set LAMELLA_PG_PORT.`);
  }
  asPostgres(path.join(bin, 'pg_ctl'), [
    '-D', clusterDir, '-l', logFile, '-w', '-t', '30',
    '-o', `-c listen_addresses=127.0.0.1 -p ${opts.port} -k ${socketDir}`,
    'start',
  ], { quiet: true });
  const psql = (sql: string) =>
    asPostgres(path.join(bin, 'psql'), ['-h', '127.0.0.1', '-p', String(opts.port), '-U', 'postgres', '-d', 'postgres', '-tAc', sql], { quiet: true });
  return {
    port: opts.port,
    url: (db) => `postgres://postgres@127.0.0.1:${opts.port}/${db}`,
    createDatabase(name) {
      if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`bad database name ${name}`);
      const exists = psql(`SELECT 1 FROM pg_database WHERE datname='${name}'`).trim() === '1';
      if (!exists) psql(`CREATE DATABASE ${name}`);
    },
    stop() {
      try {
        asPostgres(path.join(bin, 'pg_ctl'), ['-D', clusterDir, '-m', 'fast', '-w', 'stop'], { quiet: true });
      } catch (err) {
        log(`stopping PostgreSQL: ${(err as Error).message}`);
      }
    },
  };
}

export interface RunningRedis {
  url: string;
  port: number;
  stop: () => void;
  child: ChildProcess;
}

export async function startRedis(opts: { dataDir: string; port: number }): Promise<RunningRedis> {
  const dir = path.join(opts.dataDir, 'redis');
  fs.mkdirSync(dir, { recursive: true });
  if (await portOpen(opts.port)) {
    throw new Error(`Port ${opts.port} on 127.0.0.1 is already in use; stop what runs there or set LAMELLA_REDIS_PORT.`);
  }
  const child = spawn(
    'redis-server',
    ['--port', String(opts.port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'yes', '--dir', dir, '--daemonize', 'no'],
    { stdio: ['ignore', 'ignore', 'inherit'] },
  );
  await waitFor(() => portOpen(opts.port), 'redis-server');
  return {
    url: `redis://127.0.0.1:${opts.port}`,
    port: opts.port,
    child,
    stop: () => {
      child.kill('SIGTERM');
    },
  };
}

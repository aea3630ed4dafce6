// A worker killed mid-bundle (SIGKILL: no clean-up of its own) must leave nothing half-written
// where a finished bundle is expected: after a restart BullMQ's stalled-job check hands the job to
// the new worker, which ends with one complete zip (checked with Info-ZIP's `unzip -t`) and no
// temporary `.part` file left anywhere in the session's folder.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn, type ChildProcess } from 'node:child_process';
import { Readable } from 'node:stream';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { createSession } from '../helpers/sessions';
import { until } from '../helpers/worker';
import { unzipTest, zipEntries } from '../helpers/bundles';

const FILES = 40;
const FILE_BYTES = 8 * 1024 * 1024;
const LOCK_MS = 2000;

let app: Express;
let fx: StudioFixture;
let photographer: Agent;
let sessionId = '';
let stackId = '';
const children: ChildProcess[] = [];
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-kill-test-'));

function startWorker(): { child: ChildProcess; output: () => string } {
  const child = spawn(process.execPath, ['--import', 'tsx', 'worker/index.ts'], {
    cwd: path.resolve(import.meta.dirname, '../..'),
    env: { ...process.env, LAMELLA_WORKER_LOCK_MS: String(LOCK_MS), LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (c: Buffer) => (output += c.toString()));
  child.stderr?.on('data', (c: Buffer) => (output += c.toString()));
  children.push(child);
  return { child, output: () => output };
}

const exited = (child: ChildProcess) => new Promise<void>((resolve) => (child.exitCode !== null || child.signalCode !== null ? resolve() : child.once('exit', () => resolve())));

function partFilesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((name) => /\.part(-|$)/.test(path.basename(name)));
}

/** Originals stored with the storage helpers and rows written directly: 40 frames of 8 MB. */
async function stackOfLargeFrames() {
  const { getDataSource } = await import('../../server/lib/data-source');
  const { getStore, storageKeys } = await import('../../server/lib/storage');
  const ds = getDataSource();
  const [stack] = await ds.query(`INSERT INTO stacks (session_id, name, state, position, start_reason, version) VALUES ($1, 'Museum beetle, dorsal', 'ready', 0, 'first', 1) RETURNING id`, [sessionId]);
  const start = Date.UTC(2026, 6, 3, 14, 0, 0);
  for (let i = 0; i < FILES; i++) {
    // Random bytes, like RAW data: nothing for a zip to compress.
    const put = await getStore().putStream(Readable.from([crypto.randomBytes(FILE_BYTES)]));
    await put.commit(storageKeys.original(sessionId, put.result.sha256));
    const name = `BTL_${String(i + 1).padStart(4, '0')}.DNG`;
    const [file] = await ds.query(
      `INSERT INTO stored_files (session_id, sha256, original_name, display_name, storage_key, size_bytes, kind, mime, is_raw, metadata, capture_time_ms, flags)
       VALUES ($1, $2, $3, $3, $4, $5, 'dng', 'image/x-adobe-dng', true, '{}', $6, '{}') RETURNING id`,
      [sessionId, put.result.sha256, name, storageKeys.original(sessionId, put.result.sha256), put.result.sizeBytes, start + i * 2000],
    );
    const frameId = crypto.randomUUID();
    await ds.query(
      `INSERT INTO frames (id, session_id, primary_file_id, file_name, capture_time_ms, stack_id, position, excluded, flags, preview_status, preview_error)
       VALUES ($1, $2, $3, $4, $5, $6, $7, false, '{}', 'failed', 'no preview in this test')`,
      [frameId, sessionId, file.id, name, start + i * 2000, stack.id, i],
    );
    await ds.query(`UPDATE stored_files SET frame_id = $1 WHERE id = $2`, [frameId, file.id]);
  }
  return stack.id as string;
}

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Kill Studio');
  photographer = await agentFor(app, fx.users.photographer);
  sessionId = await createSession(photographer, fx.studioId, 'Museum beetle');
  stackId = await stackOfLargeFrames();
});
afterAll(async () => {
  for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  await Promise.all(children.map(exited));
  fs.rmSync(tmp, { recursive: true, force: true });
});

describe('a worker killed mid-bundle', () => {
  it('leaves no half-written bundle, and the job finishes once a worker is back', async () => {
    const { getDataSource } = await import('../../server/lib/data-source');
    const ds = getDataSource();
    const sessionDir = path.join(process.env.LAMELLA_DATA_DIR!, 'sessions', sessionId);
    const row = async (id: string) => (await ds.query(`SELECT status, progress, error FROM bundles WHERE id = $1`, [id]))[0] as { status: string; progress: number; error: string | null };

    const first = startWorker();
    const requested = await photographer.post(`/api/studios/${fx.studioId}/stacks/${stackId}/bundles`).set('x-csrf-token', photographer.csrf).send({});
    expect(requested.status).toBe(202);
    const bundleId = requested.body.id as string;

    // Past the contact sheet (the first 10 %), inside the zip.
    await until('the bundle under way', async () => {
      const r = await row(bundleId);
      if (r.status === 'done') throw new Error('the bundle finished before the worker could be killed: give it more data');
      return r.status === 'running' && r.progress > 12 && r.progress < 90;
    }, 60_000);
    first.child.kill('SIGKILL');
    await exited(first.child);
    expect(first.child.signalCode).toBe('SIGKILL');

    const killed = await row(bundleId);
    expect(killed.status).toBe('running');
    expect(killed.progress).toBeGreaterThan(0);
    expect(killed.progress).toBeLessThan(100);
    expect(partFilesUnder(sessionDir).length, 'the killed worker left its temporary zip').toBeGreaterThan(0);
    const early = await photographer.get(`/api/studios/${fx.studioId}/bundles/${bundleId}/download`);
    expect(early.status).toBe(409);

    const second = startWorker();
    const done = await until('the bundle done after the restart', async () => {
      const r = await row(bundleId);
      if (r.status === 'failed') throw new Error(`bundle failed: ${r.error}\n${second.output()}`);
      return r.status === 'done' && r;
    }, 120_000);
    expect(done.progress).toBe(100);
    second.child.kill('SIGTERM');
    await exited(second.child);

    const bundles = await ds.query(`SELECT id, status FROM bundles WHERE stack_id = $1`, [stackId]);
    expect(bundles).toEqual([{ id: bundleId, status: 'done' }]);
    expect(partFilesUnder(sessionDir)).toEqual([]);

    const zip = path.join(tmp, 'beetle.zip');
    const res = await photographer.get(`/api/studios/${fx.studioId}/bundles/${bundleId}/download`).maxResponseSize(2 ** 31).buffer(true).parse((r, cb) => {
      const out = fs.createWriteStream(zip);
      r.pipe(out);
      out.on('finish', () => cb(null, null));
    });
    expect(res.status).toBe(200);
    expect(fs.statSync(zip).size).toBe(Number(res.headers['content-length']));
    expect(unzipTest(zip)).toMatch(/No errors detected/); // Info-ZIP unzip -t checks every CRC
    const entries = zipEntries(zip);
    expect(entries.filter((e) => /^Museum beetle, dorsal_\d{3}\.dng$/.test(e))).toHaveLength(FILES);
  });
});

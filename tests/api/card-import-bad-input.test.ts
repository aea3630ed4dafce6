import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { BASE_TIME_MS, settings, taggedJpeg } from '../helpers/card';
import { readWithExiftool, writeTags } from '../helpers/exiftool';
import { jpegDeclaring, pngDeclaring } from '../helpers/crafted-files';
import { createImport, createSession, sessionsBase, uploadFiles, type CardFileSpec, type FrameV, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';

let app: Express;
let fx: StudioFixture;
let photographer: Agent;
let workers: { stop: () => Promise<void> };
let tmp: string;
let incoming: string;
let incomingBefore: Set<string>;
const incomingNow = () => (fs.existsSync(incoming) ? fs.readdirSync(incoming) : []);

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Bad Input Studio');
  photographer = await agentFor(app, fx.users.photographer);
  workers = await startTestWorkers();
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-bad-input-'));
  const { getStore } = await import('../../server/lib/storage');
  incoming = path.join(path.dirname(getStore().localPath('x')), '.incoming');
  incomingBefore = new Set(incomingNow());
});
afterAll(async () => {
  await workers?.stop();
  if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
});

const sha = (b: Buffer) => crypto.createHash('sha256').update(b).digest('hex');
let shade = 10;
const jpeg = (captureTimeMs = BASE_TIME_MS + shade * 1000) => taggedJpeg(settings(captureTimeMs), (shade += 7) % 250);

/** A JPEG whose DateTimeOriginal is written as given (exiftool writes what a camera would not). */
async function jpegDated(exifDate: string): Promise<Buffer> {
  const file = path.join(tmp, `${crypto.randomUUID()}.jpg`);
  fs.writeFileSync(file, await jpeg());
  await writeTags(file, { 'DateTimeOriginal#': exifDate, 'SubSecTimeOriginal#': '', 'OffsetTimeOriginal#': '' });
  const [read] = await readWithExiftool([file]);
  expect(read['EXIF:DateTimeOriginal']).toBe(exifDate); // exiftool reads back the date the test means
  return fs.readFileSync(file);
}

async function storedRow(sessionId: string, fileId: string) {
  const { getDataSource } = await import('../../server/lib/data-source');
  const [row] = await getDataSource().query(`SELECT original_name, display_name, storage_key, sha256, flags FROM stored_files WHERE id = $1 AND session_id = $2`, [fileId, sessionId]);
  return row as { original_name: string; display_name: string; storage_key: string; sha256: string; flags: string[] };
}

interface Outcome { name: string; status: 'stored' | 'duplicate' | 'refused'; fileId?: string; reason?: string; flags?: string[] }

describe('bad files in a card import', () => {
  it('gives each bad file a clear reason or flag, stores the rest safely, and finishes the import', async () => {
    const sessionId = await createSession(photographer, fx.studioId, 'Museum beetle');
    const importId = await createImport(photographer, fx.studioId, sessionId);
    const good = await jpeg(BASE_TIME_MS);
    const full = await jpeg(BASE_TIME_MS + 6000);
    const smallJpeg = await jpeg(BASE_TIME_MS + 12_000);
    const hugeJpeg = jpegDeclaring(smallJpeg, 30_000, 30_000);
    const hugePng = pngDeclaring(30_000, 30_000);
    // exiftool reads only the headers: both files declare 30000 × 30000 pixels. (ImageMagick's
    // Debian policy refuses anything wider than 16k pixels, so it cannot serve as the reference.)
    for (const [ext, data] of [['png', hugePng], ['jpg', hugeJpeg]] as const) {
      const file = path.join(tmp, `huge.${ext}`);
      fs.writeFileSync(file, data);
      const [read] = await readWithExiftool([file]);
      const group = ext === 'png' ? 'PNG' : 'File';
      expect([read[`${group}:ImageWidth`], read[`${group}:ImageHeight`]]).toEqual([30_000, 30_000]);
    }
    const longName = `${'fern-frond-'.repeat(30)}0042.jpg`;
    const files: (CardFileSpec & { expect: (o: Outcome) => void | Promise<void> })[] = [
      { name: 'BTL_0001.JPG', data: good, expect: (o) => expect(o.status).toBe('stored') },
      { name: 'BTL_0002.JPG', data: Buffer.alloc(0), expect: (o) => expect(o).toMatchObject({ status: 'refused', reason: expect.stringMatching(/empty/) }) },
      { name: 'BTL_0003.JPG', data: full.subarray(0, Math.floor(full.length * 0.6)), expect: (o) => expect(o).toMatchObject({ status: 'stored', flags: expect.arrayContaining(['truncated-file']) }) },
      { name: 'notes.jpg', data: Buffer.from('Beetle on pin 4, left antenna bent.\n'), expect: (o) => expect(o).toMatchObject({ status: 'refused', reason: expect.stringMatching(/text/) }) },
      { name: 'run.jpg', data: Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(120)]), expect: (o) => expect(o).toMatchObject({ status: 'refused', reason: expect.stringMatching(/executable/) }) },
      { name: 'setup.jpg', data: Buffer.concat([Buffer.from('MZ'), Buffer.alloc(200)]), expect: (o) => expect(o).toMatchObject({ status: 'refused', reason: expect.stringMatching(/executable/) }) },
      { name: 'tidy.jpg', data: Buffer.from('#!/bin/sh\nrm -rf ./cache\n'), expect: (o) => expect(o).toMatchObject({ status: 'refused', reason: expect.stringMatching(/executable script/) }) },
      { name: '../../etc/BTL_0004.JPG', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: '/var/lib/BTL_0005.JPG', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: 'BTL\t_\u0085\u009b0006.JPG', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: 'frond\u202egpj.exe', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: longName, data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: 'папоротник_0007.jpg', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: '羊歯の露_0008.jpg', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: 'سرخس_0009.jpg', data: await jpeg(), expect: (o) => expect(o.status).toBe('stored') },
      { name: 'BTL_0010.JPG', data: await jpegDated('0000:01:01 00:00:00'), mtimeMs: BASE_TIME_MS + 60_000, expect: (o) => expect(o.flags).toEqual(expect.arrayContaining(['implausible-capture-time', 'no-capture-time'])) },
      { name: 'BTL_0011.JPG', data: await jpegDated('2150:05:14 09:30:00'), expect: (o) => expect(o.flags).toEqual(expect.arrayContaining(['implausible-capture-time', 'no-capture-time'])) },
      { name: 'BTL_0012.PNG', data: hugePng, expect: (o) => expect(o.status).toBe('stored') },
      { name: 'BTL_0013.JPG', data: hugeJpeg, expect: (o) => expect(o.status).toBe('stored') },
      { name: 'BTL_0014.JPG', data: smallJpeg, expect: (o) => expect(o.status).toBe('stored') },
      { name: 'BTL_0014 (1).JPG', data: smallJpeg, expect: (o) => expect(o.status).toBe('duplicate') }, // the same file twice in one request
    ];
    const rssBefore = process.memoryUsage().rss;
    const res = await uploadFiles(photographer, fx.studioId, sessionId, importId, files);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const outcomes: Outcome[] = res.body.files;
    expect(outcomes).toHaveLength(files.length);
    for (const [i, f] of files.entries()) await f.expect(outcomes[i]);
    expect(outcomes.at(-1)!.fileId).toBe(outcomes.at(-2)!.fileId);

    // Names: storage keys are made of the content hash only; display names are as given, minus
    // folders and invisible characters.
    const expectedDisplay: Record<number, (n: string) => void> = {
      7: (n) => expect(n).toBe('BTL_0004.JPG'),
      8: (n) => expect(n).toBe('BTL_0005.JPG'),
      9: (n) => expect(n).toBe('BTL_0006.JPG'),
      10: (n) => expect(n).toBe('frondgpj.exe'),
      11: (n) => {
        expect(n.length).toBeLessThanOrEqual(200);
        expect(n.startsWith('fern-frond-fern-frond-')).toBe(true);
        expect(n.endsWith('.jpg')).toBe(true);
      },
      12: (n) => expect(n).toBe('папоротник_0007.jpg'),
      13: (n) => expect(n).toBe('羊歯の露_0008.jpg'),
      14: (n) => expect(n).toBe('سرخس_0009.jpg'),
    };
    const { getStore } = await import('../../server/lib/storage');
    for (const [i, o] of outcomes.entries()) {
      if (o.status !== 'stored') continue;
      const row = await storedRow(sessionId, o.fileId!);
      expect(row.storage_key).toMatch(new RegExp(`^sessions/${sessionId}/originals/[0-9a-f]{2}/${row.sha256}$`));
      expect(row.sha256).toBe(sha(files[i].data));
      expect(sha(fs.readFileSync(getStore().localPath(row.storage_key)))).toBe(row.sha256);
      expectedDisplay[i]?.(row.display_name);
    }

    const done = await photographer.post(`${sessionsBase(fx.studioId)}/${sessionId}/imports/${importId}/complete`).set('x-csrf-token', photographer.csrf).send({});
    expect(done.status).toBe(200);
    const stored = outcomes.filter((o) => o.status === 'stored').length;
    expect(done.body).toMatchObject({ storedCount: stored, duplicateCount: 1, refusedCount: 5 });

    // Previews: a placeholder flagged too-large for the pictures declaring 900 MP, never decoded.
    const frames = await until('previews', async () => {
      const v: SortingV = (await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`)).body;
      const all: FrameV[] = [...v.stacks.flatMap((s) => s.frames), ...v.loose];
      return all.length === stored && all.every((f) => f.previewStatus !== 'pending') && all;
    });
    expect(process.memoryUsage().rss - rssBefore).toBeLessThan(1.5e9); // one decoded 30000² RGB picture alone is 2.7 GB
    for (const name of ['BTL_0012.PNG', 'BTL_0013.JPG']) {
      const frame = frames.find((f) => f.fileName === name)!;
      expect(frame).toMatchObject({ previewStatus: 'done', flags: expect.arrayContaining(['too-large', 'no-preview']) });
      const small = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/frames/${frame.id}/preview/small`).buffer(true)
        .parse((r, cb) => {
          const chunks: Buffer[] = [];
          r.on('data', (c: Buffer) => chunks.push(c));
          r.on('end', () => cb(null, Buffer.concat(chunks)));
        });
      expect(small.status).toBe(200);
      const meta = await sharp(small.body as Buffer).metadata();
      expect(meta.format).toBe('jpeg');
      expect(Math.max(meta.width ?? 0, meta.height ?? 0)).toBeLessThanOrEqual(320);
    }
    for (const f of frames) if (f.previewStatus === 'failed') expect(f.previewError).toMatch(/Preview could not be made/);
    // The file without a readable time sorts by its file time and stays, flagged.
    const year0 = frames.find((f) => f.fileName === 'BTL_0010.JPG')!;
    expect(year0.captureTimeMs).toBe(BASE_TIME_MS + 60_000);
    expect(year0.flags).toContain('implausible-capture-time');
  });

  it('refuses a malformed multipart body with a clear message, and the import goes on', async () => {
    const sessionId = await createSession(photographer, fx.studioId);
    const importId = await createImport(photographer, fx.studioId, sessionId);
    const url = `${sessionsBase(fx.studioId)}/${sessionId}/imports/${importId}/files`;
    const cut = await photographer.post(url).set('x-csrf-token', photographer.csrf).set('content-type', 'multipart/form-data; boundary=FERN')
      .send('--FERN\r\nContent-Disposition: form-data; name="files"; filename="BTL_0001.JPG"\r\nContent-Type: image/jpeg\r\n\r\n\xff\xd8\xff');
    expect(cut.status).toBe(400);
    expect(cut.body.error.message).toMatch(/not a valid multipart form|Unexpected end/i);
    const noBoundary = await photographer.post(url).set('x-csrf-token', photographer.csrf).set('content-type', 'multipart/form-data').send('garbage');
    expect(noBoundary.status).toBe(400);
    expect(noBoundary.body.error.message).toBeTruthy();
    const jsonInstead = await photographer.post(url).set('x-csrf-token', photographer.csrf).send({ files: ['BTL_0001.JPG'] });
    expect(jsonInstead.status).toBe(400);
    expect(jsonInstead.body.error.message).toMatch(/Send one or more files/);
    const wrongField = await photographer.post(url).set('x-csrf-token', photographer.csrf).attach('pictures', await jpeg(), 'BTL_0001.JPG');
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.error.message).toMatch(/Unexpected file field/i);

    // Multipart headers cannot carry C0 control characters (busboy refuses the part), so such a name
    // fails its own request with a reason; the client strips them before sending (tab and C1 pass).
    const bell = await uploadFiles(photographer, fx.studioId, sessionId, importId, [{ name: 'BTL\u0007_0002.JPG', data: await jpeg() }]);
    expect(bell.status).toBe(400);
    expect(bell.body.error.message).toMatch(/not a valid multipart form.*Nothing from it was kept/);

    const ok = await uploadFiles(photographer, fx.studioId, sessionId, importId, [{ name: 'BTL_0001.JPG', data: await jpeg() }]);
    expect(ok.status).toBe(201);
    expect(ok.body.files[0].status).toBe('stored');
    const imports = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/imports`).expect(200);
    expect(imports.body.imports[0]).toMatchObject({ storedCount: 1, refusedCount: 0 });
  });

  it('refuses uploads by guests and retouchers (403) and into another studio’s session (403/404)', async () => {
    const sessionId = await createSession(photographer, fx.studioId);
    const importId = await createImport(photographer, fx.studioId, sessionId);
    const file = [{ name: 'BTL_0001.JPG', data: await jpeg() }];
    for (const role of ['guest', 'retoucher'] as const) {
      const agent = await agentFor(app, fx.users[role]);
      const res = await uploadFiles(agent, fx.studioId, sessionId, importId, file);
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/role|allow/i);
    }
    const other = await createStudioWithRoles('Other Bench');
    const stranger = await agentFor(app, other.users.owner);
    expect((await uploadFiles(stranger, fx.studioId, sessionId, importId, file)).status).toBe(403);
    const own = await uploadFiles(stranger, other.studioId, sessionId, importId, file);
    expect(own.status).toBe(404);
    expect(own.body.error.message).toMatch(/No such session/);
    expect((await stranger.post(`${sessionsBase(other.studioId)}/${sessionId}/imports/${importId}/complete`).set('x-csrf-token', stranger.csrf).send({})).status).toBe(404);
    // A real import of the other studio cannot take files addressed through our session either.
    const theirSession = await createSession(stranger, other.studioId);
    const theirImport = await createImport(stranger, other.studioId, theirSession);
    expect((await uploadFiles(photographer, fx.studioId, sessionId, theirImport, file)).status).toBe(404);
    const imports = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/imports`).expect(200);
    expect(imports.body.imports[0]).toMatchObject({ storedCount: 0, duplicateCount: 0, refusedCount: 0 });
  });

  it('leaves no half-received temporary file behind after any of the requests above', () => {
    expect(incomingNow().filter((name) => !incomingBefore.has(name))).toEqual([]);
  });
});

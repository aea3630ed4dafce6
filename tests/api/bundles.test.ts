// Bundles and contact sheets end to end: a card uploaded through the API, sorted and edited, the
// worker running in this process. The zips are checked with Info-ZIP's unzip, the sheets with
// poppler's pdfinfo and ImageMagick; checksums against the uploaded bytes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { BASE_TIME_MS, settings, taggedJpeg, taggedTiff } from '../helpers/card';
import { sessionWithCard, sessionsBase, type CardFileSpec, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { decodedRgb, getBinary, imageSize, pdfPages, sha256File, sha256Of, unzipTest, unzipTo, zipEntries } from '../helpers/bundles';
import { defaultColumns } from '../../worker/lib/contact-sheet-layout';
import { FRAMES_PER_PAGE } from '../../worker/lib/contact-sheet-pdf';
import type { BundleView, StackDetailView } from '../../shared/schemas/bundles';
import type { BundleManifest } from '../../shared/schemas/manifest';

let app: Express;
let fx: StudioFixture;
const as = {} as Record<'owner' | 'photographer' | 'retoucher' | 'guest' | 'stranger', Agent>;
let workers: { stop: () => Promise<void> };
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-bundles-test-'));

// Stack A: 26 frames 4 s apart, the first three shot RAW (a TIFF twin) + JPEG; five minutes later
// stack B: 4 frames. Each frame's picture has its own red level, so cells can be told apart.
const A_FRAMES = 26;
const PAIRED = 3;
const EXCLUDED_INDEX = 4;
const STACK_NAME = 'Fern frond dew';
const redOf = (n: number) => 40 + n * 7;
const card: CardFileSpec[] = [];

let sessionId = '';
let stackA = '';
let stackB = '';
let planFrames = 0;
let planPositions = 0;
let bundle: BundleView;

const sUrl = (p: string) => `${sessionsBase(fx.studioId)}/${sessionId}${p}`;
const stackUrl = (id: string, p = '') => `/api/studios/${fx.studioId}/stacks/${id}${p}`;
const bundleUrl = (id: string, p = '') => `/api/studios/${fx.studioId}/bundles/${id}${p}`;
const send = (a: Agent, method: 'post' | 'patch', url: string, body: object = {}) => a[method](url).set('x-csrf-token', a.csrf).send(body);
const detail = async (a: Agent = as.photographer) => (await a.get(stackUrl(stackA)).expect(200)).body as StackDetailView;
const db = async () => (await import('../../server/lib/data-source')).getDataSource();
const waitForBundle = (id: string, status: BundleView['status'] = 'done') =>
  until(`bundle ${status}`, async () => {
    const b = (await as.photographer.get(bundleUrl(id)).expect(200)).body as BundleView;
    if (b.status === 'failed' && status !== 'failed') throw new Error(`bundle failed: ${b.error}`);
    return b.status === status && b;
  });

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Bundle Studio');
  for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) as[role] = await agentFor(app, fx.users[role]);
  as.stranger = await agentFor(app, (await createStudioWithRoles('Elsewhere')).users.owner);
  workers = await startTestWorkers();

  let t = BASE_TIME_MS;
  for (let n = 1; n <= A_FRAMES + 4; n++) {
    if (n === A_FRAMES + 1) t += 5 * 60_000;
    const name = `FRN_${String(n).padStart(4, '0')}`;
    card.push({ name: `${name}.JPG`, data: await taggedJpeg(settings(t), redOf(n)) });
    if (n <= PAIRED) card.push({ name: `${name}.TIF`, data: await taggedTiff(settings(t), redOf(n)) });
    t += 4000;
  }
  const made = await sessionWithCard(as.photographer, fx.studioId, card);
  sessionId = made.sessionId;
  expect(made.sorting.stacks.map((s) => s.frames.length)).toEqual([A_FRAMES, 4]);
  [stackA, stackB] = made.sorting.stacks.map((s) => s.id);
  await until('previews', async () => {
    const v = (await as.photographer.get(sUrl('/sorting'))).body as SortingV;
    return v.stacks.every((s) => s.frames.every((f) => f.previewStatus === 'done'));
  });

  const plan = await send(as.photographer, 'post', `/api/studios/${fx.studioId}/plans`, {
    name: 'Dew on a fern frond',
    focusingMethod: 'rail',
    inputs: { focalLengthMm: 50, extensionMm: 25, fNumber: 8, cocMm: 0.03, sensor: { widthMm: 23.5, heightMm: 15.6, pixelsAcross: 3872 }, depthMm: 4, overlap: 0.2, dofModel: 'geometric', railStepUm: 5 },
  }).expect(201);
  planFrames = plan.body.result.frames;
  planPositions = plan.body.result.positionsMm.length;
  await send(as.photographer, 'patch', sUrl(`/stacks/${stackA}`), { name: STACK_NAME, planId: plan.body.id }).expect(200);
  const a = made.sorting.stacks[0];
  await send(as.photographer, 'post', sUrl('/frames/exclusion'), { frameIds: [a.frames[EXCLUDED_INDEX].id], excluded: true }).expect(200);
  await send(as.photographer, 'post', sUrl(`/stacks/${stackA}/state`), { state: 'ready' }).expect(200);
});
afterAll(async () => {
  await workers?.stop();
  fs.rmSync(tmp, { recursive: true, force: true });
});

/** Card index (1-based frame number n) of each frame left in stack A, in order. */
const includedNumbers = () => Array.from({ length: A_FRAMES }, (_, i) => i + 1).filter((n) => n !== EXCLUDED_INDEX + 1);

describe('the stack page', () => {
  it('shows the frames in order with the excluded one marked, the plan, and counts', async () => {
    const d = await detail();
    expect(d).toMatchObject({ name: STACK_NAME, state: 'ready', plan: { name: 'Dew on a fern frond' }, counts: { frames: A_FRAMES, included: A_FRAMES - 1, excluded: 1 } });
    expect(d.frames.map((f) => f.fileName.replace(/\.\w+$/, ''))).toEqual(Array.from({ length: A_FRAMES }, (_, i) => `FRN_${String(i + 1).padStart(4, '0')}`));
    expect(d.frames[EXCLUDED_INDEX]).toMatchObject({ excluded: true, bundleNumber: null });
    expect(d.frames[EXCLUDED_INDEX + 1].bundleNumber).toBe(EXCLUDED_INDEX + 1);
    expect(d.frames[0].files.map((f) => f.name).sort()).toEqual(['FRN_0001.JPG', 'FRN_0001.TIF']);
    expect(d.contactSheet.status).toBe('none');
    expect((await as.guest.get(stackUrl(stackA))).status).toBe(200);
    expect((await as.retoucher.get(stackUrl(stackA))).status).toBe(403);
    expect((await as.stranger.get(`/api/studios/${fx.studioId}/stacks/${stackA}`)).status).toBe(403);
    expect((await as.photographer.get(stackUrl('0d6c6f5e-4d0e-4c8e-9d55-000000000000'))).status).toBe(404);
  });
});

describe('contact sheets', () => {
  it('are made on request, JPEG and PDF, with every kept frame in order', async () => {
    expect((await as.guest.get(stackUrl(stackA, '/contact-sheet.jpg'))).status).toBe(404);
    expect((await send(as.guest, 'post', stackUrl(stackA, '/contact-sheet'))).status).toBe(403);
    expect((await send(as.photographer, 'post', stackUrl(stackA, '/contact-sheet'), { columns: 3 })).status).toBe(422);
    expect((await send(as.photographer, 'post', stackUrl(stackA, '/contact-sheet'))).status).toBe(202);
    const sheet = await until('sheet', async () => {
      const d = await detail();
      if (d.contactSheet.status === 'failed') throw new Error(d.contactSheet.error ?? 'failed');
      return d.contactSheet.status === 'done' && d.contactSheet;
    });
    expect(sheet.missingPreviews).toBe(0);

    const jpeg = await getBinary(as.guest, stackUrl(stackA, '/contact-sheet.jpg')).expect(200);
    expect(jpeg.headers['content-type']).toBe('image/jpeg');
    const jpegPath = path.join(tmp, 'sheet.jpg');
    fs.writeFileSync(jpegPath, jpeg.body as Buffer);
    const size = imageSize(jpegPath); // ImageMagick identify
    expect(size).toEqual({ format: 'JPEG', widthPx: sheet.widthPx, heightPx: sheet.heightPx });
    // Each cell's picture has the red level of its frame, in stack order, the excluded one left out.
    // Cell geometry of worker/lib/contact-sheet.ts at full scale: 150 px header, 312 px rows,
    // thumbnails 320 × 240 at 12 px from the cell's corner.
    const kept = includedNumbers();
    const columns = defaultColumns(kept.length);
    const cellW = size.widthPx / columns;
    const decoded = decodedRgb(jpegPath);
    const reds = kept.map((_, i) => decoded.meanColour(Math.round((i % columns) * cellW + 12 + 140), 150 + Math.floor(i / columns) * 312 + 12 + 100, 40, 40).r);
    reds.forEach((r, i) => expect(Math.abs(r - redOf(kept[i])), `cell ${i + 1}`).toBeLessThan(4));

    const pdf = await getBinary(as.guest, stackUrl(stackA, '/contact-sheet.pdf')).expect(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    fs.writeFileSync(path.join(tmp, 'sheet.pdf'), pdf.body as Buffer);
    expect(pdfPages(path.join(tmp, 'sheet.pdf'))).toBe(Math.ceil(kept.length / FRAMES_PER_PAGE)); // poppler pdfinfo
    expect(sheet.pages).toBe(pdfPages(path.join(tmp, 'sheet.pdf')));
  });
});

describe('stack bundles', () => {
  it('are asked for once per stack version and refused to those without the right', async () => {
    expect((await send(as.guest, 'post', stackUrl(stackA, '/bundles'))).status).toBe(403);
    expect((await send(as.retoucher, 'post', stackUrl(stackA, '/bundles'))).status).toBe(403);
    expect((await send(as.photographer, 'post', stackUrl(stackA, '/bundles'), { store: false })).status).toBe(422);
    const first = await send(as.photographer, 'post', stackUrl(stackA, '/bundles')).expect(202);
    const again = await send(as.owner, 'post', stackUrl(stackA, '/bundles')).expect(200);
    expect(again.body.id).toBe(first.body.id);
    expect(first.body).toMatchObject({ kind: 'stack', stackVersion: (await detail()).version, stale: false });
    bundle = await waitForBundle(first.body.id);
    expect(bundle).toMatchObject({ progress: 100, fileName: `${STACK_NAME}.zip` });
  });

  it('hold the kept originals renamed in stack order, checksummed, with sheets and the plan', async () => {
    const res = await getBinary(as.photographer, bundleUrl(bundle.id, '/download')).expect(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toContain(`attachment; filename="${STACK_NAME}.zip"`);
    expect(Number(res.headers['content-length'])).toBe((res.body as Buffer).length);
    expect((res.body as Buffer).length).toBe(bundle.bytes);
    const zip = path.join(tmp, 'stack.zip');
    fs.writeFileSync(zip, res.body as Buffer);
    expect(unzipTest(zip)).toMatch(/No errors detected/); // Info-ZIP unzip -t

    const kept = includedNumbers();
    const expected = kept.flatMap((n, i) => {
      const num = String(i + 1).padStart(3, '0');
      return n <= PAIRED ? [`${STACK_NAME}_${num}.tif`, `${STACK_NAME}_${num}.jpg`] : [`${STACK_NAME}_${num}.jpg`];
    });
    const entries = zipEntries(zip);
    expect(entries.filter((e) => /_\d{3}\.\w+$/.test(e))).toEqual(expected);
    expect(entries).toEqual(expect.arrayContaining(['contact-sheet.pdf', 'contact-sheet.jpg', 'plan.txt', 'manifest.csv', 'manifest.json']));

    const out = path.join(tmp, 'stack');
    unzipTo(zip, out);
    const manifest = JSON.parse(fs.readFileSync(path.join(out, 'manifest.json'), 'utf8')) as BundleManifest;
    expect(manifest.frames.map((f) => f.number)).toEqual(kept.map((_, i) => i + 1));
    const originalSha = new Map(card.map((f) => [f.name, sha256Of(f.data)]));
    for (const frame of manifest.frames) {
      for (const file of frame.files) {
        expect(sha256File(path.join(out, file.newName)), file.newName).toBe(file.sha256);
        expect(originalSha.get(file.originalName), file.originalName).toBe(file.sha256);
      }
    }
    const excludedName = `FRN_${String(EXCLUDED_INDEX + 1).padStart(4, '0')}.JPG`;
    expect(manifest.frames.flatMap((f) => f.files.map((x) => x.originalName))).not.toContain(excludedName);
    const extracted = fs.readdirSync(out).map((n) => sha256File(path.join(out, n)));
    expect(extracted).not.toContain(originalSha.get(excludedName));
    expect(pdfPages(path.join(out, 'contact-sheet.pdf'))).toBe(Math.ceil(kept.length / FRAMES_PER_PAGE));
    const planText = fs.readFileSync(path.join(out, 'plan.txt'), 'utf8');
    expect(planText).toContain('Plan: Dew on a fern frond');
    expect(Number(/^\s*frames\s+(\d+)/m.exec(planText)?.[1])).toBe(planFrames);
    expect(planText.split('\n').filter((l) => /^\s+\d+\s+\d+\.\d{4}/.test(l))).toHaveLength(planPositions);
  });

  it('are downloaded by the retoucher the stack is handed to, never by guests or others', async () => {
    const download = bundleUrl(bundle.id, '/download');
    expect((await as.guest.get(download)).status).toBe(403);
    expect((await as.guest.get(bundleUrl(bundle.id))).status).toBe(200);
    expect((await as.retoucher.get(download)).status).toBe(403);
    expect((await as.stranger.get(`/api/studios/${fx.studioId}/bundles/${bundle.id}/download`)).status).toBe(403);
    const ds = await db();
    await ds.query(`UPDATE stacks SET state = 'handed-off', handed_to_user_id = $2 WHERE id = $1`, [stackA, fx.users.retoucher.id]);
    try {
      const res = await getBinary(as.retoucher, download).expect(200);
      expect(sha256Of(res.body as Buffer)).toBe(sha256File(path.join(tmp, 'stack.zip')));
      expect((await as.retoucher.get(stackUrl(stackA, '/contact-sheet.jpg'))).status).toBe(200);
      expect((await as.retoucher.get(stackUrl(stackB))).status).toBe(403);
    } finally {
      await ds.query(`UPDATE stacks SET state = 'ready', handed_to_user_id = NULL WHERE id = $1`, [stackA]);
    }
  });

  it('turn stale when the stack changes, and a new one is made for the new version', async () => {
    const a = await detail();
    await send(as.photographer, 'post', sUrl('/frames/exclusion'), { frameIds: [a.frames[EXCLUDED_INDEX].id], excluded: false }).expect(200);
    const after = await detail();
    expect(after.version).toBeGreaterThan(a.version);
    expect(after.latestBundle).toMatchObject({ id: bundle.id, stale: true });
    expect((await as.photographer.get(stackUrl(stackA, '/bundles/latest')).expect(200)).body.bundle).toMatchObject({ id: bundle.id, stale: true });
    expect(after.contactSheet.status).toBe('none');
    const fresh = await send(as.photographer, 'post', stackUrl(stackA, '/bundles')).expect(202);
    expect(fresh.body.id).not.toBe(bundle.id);
    const done = await waitForBundle(fresh.body.id);
    const zip = path.join(tmp, 'fresh.zip');
    fs.writeFileSync(zip, (await getBinary(as.owner, bundleUrl(done.id, '/download')).expect(200)).body as Buffer);
    unzipTest(zip);
    expect(zipEntries(zip).filter((e) => e.endsWith('.jpg') && e.startsWith(STACK_NAME))).toHaveLength(A_FRAMES);
  });
});

describe('session bundles', () => {
  it('hold every stack past draft, a folder each', async () => {
    const url = `${sessionsBase(fx.studioId)}/${sessionId}/bundles`;
    const first = await send(as.photographer, 'post', url).expect(202);
    expect(Object.keys(first.body.stackVersions)).toEqual([stackA]); // stack B is still a draft
    expect((await send(as.photographer, 'post', url)).body.id).toBe(first.body.id);
    await send(as.photographer, 'post', sUrl(`/stacks/${stackB}/state`), { state: 'ready' }).expect(200);
    const both = await send(as.photographer, 'post', url).expect(202);
    expect(Object.keys(both.body.stackVersions).sort()).toEqual([stackA, stackB].sort());
    const done = await waitForBundle(both.body.id);
    expect((await as.retoucher.get(bundleUrl(done.id))).status).toBe(403);
    expect((await as.photographer.get(`${url}/latest`).expect(200)).body.bundle.id).toBe(done.id);
    const zip = path.join(tmp, 'session.zip');
    fs.writeFileSync(zip, (await getBinary(as.photographer, bundleUrl(done.id, '/download')).expect(200)).body as Buffer);
    unzipTest(zip);
    const entries = zipEntries(zip);
    const folders = [...new Set(entries.map((e) => e.split('/')[0]))];
    expect(folders).toEqual([STACK_NAME, 'Stack 02']);
    expect(entries.filter((e) => e.startsWith('Stack 02/Stack 02_'))).toHaveLength(4);
    expect(entries).toContain('Stack 02/manifest.json');
  });
});

describe('bad requests', () => {
  it('says why, and a bundle whose stack changed before it was made fails with a readable error', async () => {
    const emptied = await detail();
    await send(as.photographer, 'post', sUrl('/frames/exclusion'), { frameIds: emptied.frames.map((f) => f.id), excluded: true }).expect(200);
    const refused = await send(as.photographer, 'post', stackUrl(stackA, '/bundles')).expect(400);
    expect(refused.body.error.message).toMatch(/excluded/);
    await send(as.photographer, 'post', sUrl('/frames/exclusion'), { frameIds: emptied.frames.map((f) => f.id), excluded: false }).expect(200);

    await workers.stop();
    const queued = await send(as.photographer, 'post', stackUrl(stackA, '/bundles')).expect(202);
    const early = await as.photographer.get(bundleUrl(queued.body.id, '/download')).expect(409);
    expect(early.body.error.message).toMatch(/not finished/);
    await send(as.photographer, 'patch', sUrl(`/stacks/${stackA}`), { name: `${STACK_NAME} (kept)` }).expect(200);
    workers = await startTestWorkers();
    const failed = await waitForBundle(queued.body.id, 'failed');
    expect(failed.error).toMatch(/stack changed after this bundle was requested/);
    expect((await as.photographer.get(bundleUrl(queued.body.id, '/download'))).status).toBe(409);
    expect((await as.photographer.get(bundleUrl('not-a-bundle'))).status).toBe(404);
  });
});

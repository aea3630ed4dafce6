// Stack checks end to end: rendered stacks with injected faults uploaded through the card-import
// API, previews, statistics and checks made by the worker running in this process. The truth is
// the fault each stack was rendered with; the measured luminance is checked against ImageMagick.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { createImport, createSession, sessionsBase, uploadFiles, type SortingV } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { getBinary, unzipTest, unzipTo } from '../helpers/bundles';
import { renderStack, type RenderedStack } from '../../scripts/lib/stack-renderer';
import type { BundleView } from '../../shared/schemas/bundles';
import type { BundleManifest } from '../../shared/schemas/manifest';
import type { CheckThresholdsView, StackChecksView } from '../../shared/schemas/check-views';

let app: Express;
let fx: StudioFixture;
const as = {} as Record<'owner' | 'photographer' | 'retoucher' | 'guest', Agent>;
let workers: { stop: () => Promise<void> };
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'lamella-checks-test-'));

// 16 frames of 320 x 213 px: small enough for seconds on two cores, as in tests/unit/checks.test.ts.
const SIZE = { widthPx: 320, heightPx: 213, frameCount: 16, scene: 'drop-on-leaf' } as const;
// Frame indexes count from 0 in the renderer; the stack page numbers frames from 1.
const FAULTS = { exposureJumpAt: 3, repeatAt: 7, skipStepAt: 11 };
const EXPECTED = ['exposure-jump:4', 'duplicate-frame:8,9', 'focus-gap:12,13'];

let faulty: RenderedStack;
let sessionId = '';
let faultyId = '';
let cleanId = '';

const stackUrl = (id: string, p = '') => `/api/studios/${fx.studioId}/stacks/${id}${p}`;
const thresholdsUrl = () => `/api/studios/${fx.studioId}/check-thresholds`;
const put = (a: Agent, body: unknown) => a.put(thresholdsUrl()).set('x-csrf-token', a.csrf).send(body as object);
const summary = (v: StackChecksView) => v.results!.checks.map((c) => `${c.code}:${c.frameNumbers.join(',')}`);

/** The checks once they describe the stack as it is now (and, if given, with that jump limit). */
const currentChecks = (stackId: string, exposureJumpStops?: number) =>
  until(`checks of ${stackId}`, async () => {
    const v = (await as.photographer.get(stackUrl(stackId, '/checks')).expect(200)).body as StackChecksView;
    const limitOk = exposureJumpStops === undefined || v.thresholds.exposureJumpStops === exposureJumpStops;
    return v.status === 'current' && v.results !== null && limitOk && v;
  });

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Checks Studio');
  for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) as[role] = await agentFor(app, fx.users[role]);
  workers = await startTestWorkers();
  // Two stacks an hour apart on one card: one with three faults, one clean.
  const [withFaults, clean] = await Promise.all([
    renderStack({ ...SIZE, seed: 33, faults: FAULTS }),
    renderStack({ ...SIZE, seed: 31, startTime: '2026-05-14T08:30:00.000+02:00', firstFileNumber: 101 }),
  ]);
  faulty = withFaults;
  sessionId = await createSession(as.photographer, fx.studioId, 'Dew on fern, checks');
  const importId = await createImport(as.photographer, fx.studioId, sessionId);
  const files = [...withFaults.files, ...clean.files].map((f) => ({ name: f.name, data: f.buffer }));
  expect((await uploadFiles(as.photographer, fx.studioId, sessionId, importId, files)).status).toBe(201);
  await as.photographer.post(`${sessionsBase(fx.studioId)}/${sessionId}/imports/${importId}/complete`).set('x-csrf-token', as.photographer.csrf).send({}).expect(200);
  const sorting = (await as.photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200)).body as SortingV;
  expect(sorting.stacks.map((s) => s.frames.length)).toEqual([16, 16]);
  [faultyId, cleanId] = sorting.stacks.map((s) => s.id);
});
afterAll(async () => {
  await workers?.stop();
  const { closeQueues } = await import('../../server/lib/queues');
  await closeQueues();
  fs.rmSync(tmp, { recursive: true, force: true });
});

describe('checks on uploaded stacks', () => {
  it('find exactly the injected faults, at the right frames, with advice', async () => {
    const v = await currentChecks(faultyId);
    expect(summary(v)).toEqual(EXPECTED);
    expect(v.previews).toEqual({ total: 16, pending: 0 });
    const gap = v.results!.checks.find((c) => c.code === 'focus-gap')!;
    expect(gap.severity).toBe('problem');
    expect(gap.region?.cells.length).toBeGreaterThan(0);
    expect(gap.message).toMatch(/Shoot one more frame focused between frames 12 and 13/);
    expect(v.results!.checks[0].message).toMatch(/^Frame 4 is [\d.]+ stops? brighter than the frames beside it/);
    expect(v.results!.focusMap?.sharpestFrameNumbers).toHaveLength(48);
    expect(v.results!.focusMap!.sharpestFrameNumbers.filter((n) => n !== null).length).toBeGreaterThan(10);
  });

  it('raise nothing on the clean stack', async () => {
    const v = await currentChecks(cleanId);
    expect(summary(v)).toEqual([]);
    expect(v.results!.frames.map((f) => f.number)).toEqual(Array.from({ length: 16 }, (_, i) => i + 1));
  });

  it('measure each frame’s luminance as ImageMagick does, and the jump in stops', async () => {
    const v = await currentChecks(faultyId);
    const jpegs = faulty.files.filter((f) => f.kind === 'jpeg');
    for (const i of [0, 3, 9]) {
      const file = path.join(tmp, jpegs[i].name);
      fs.writeFileSync(file, jpegs[i].buffer);
      // ImageMagick 6 `-colorspace Gray`: Rec. 709 luma of the encoded values (see worker/lib/frame-stats.ts)
      const reference = Number(execFileSync('/usr/bin/convert', [file, '-colorspace', 'Gray', '-format', '%[fx:mean]', 'info:']).toString());
      // the statistics come from the re-encoded large preview, so allow 2 %
      expect(Math.abs(v.results!.frames[i].meanLuminance! - reference), `frame ${i + 1}`).toBeLessThan(0.02 * reference);
    }
    // rendered one stop brighter; highlights that clip make the measured jump a little smaller
    const stops = v.results!.frames.map((f) => f.stops!);
    const jump = stops[3] - (stops[2] + stops[4]) / 2;
    expect(jump).toBeGreaterThan(0.6);
    expect(jump).toBeLessThan(1.1);
  });

  it('leave excluded frames out and run again after each change', async () => {
    const sorting = (await as.photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200)).body as SortingV;
    const jumpFrame = sorting.stacks[0].frames[3].id;
    await as.photographer.post(`${sessionsBase(fx.studioId)}/${sessionId}/frames/exclusion`).set('x-csrf-token', as.photographer.csrf).send({ frameIds: [jumpFrame], excluded: true }).expect(200);
    const after = await until('checks without frame 4', async () => {
      const v = await currentChecks(faultyId);
      return v.results!.excludedFrames === 1 && v;
    });
    // Frame 4 was one focus step: leaving it out makes frames 3 and 5 two steps apart, a real gap.
    expect(summary(after)).toEqual(['focus-gap:3,5', 'duplicate-frame:8,9', 'focus-gap:12,13']);
    expect(after.results!.frames.map((f) => f.number)).not.toContain(4);
    await as.photographer.post(`${sessionsBase(fx.studioId)}/${sessionId}/undo`).set('x-csrf-token', as.photographer.csrf).send({}).expect(200);
    const back = await until('checks with frame 4 again', async () => {
      const v = await currentChecks(faultyId);
      return v.results!.excludedFrames === 0 && v;
    });
    expect(summary(back)).toEqual(EXPECTED);
  });
});

describe('check thresholds', () => {
  it('are read by every member and start at the defaults', async () => {
    for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) {
      const v = (await as[role].get(thresholdsUrl()).expect(200)).body as CheckThresholdsView;
      expect(v.custom).toEqual({});
      expect(v.thresholds).toEqual(v.defaults);
    }
  });

  it('change the outcome: a 3-stop limit lets the 1-stop jump pass, and back', async () => {
    const saved = (await put(as.photographer, { exposureJumpStops: 3 }).expect(200)).body as CheckThresholdsView;
    expect(saved.custom).toEqual({ exposureJumpStops: 3 });
    expect(saved.thresholds.exposureJumpStops).toBe(3);
    expect(saved.thresholds.focusGapStepRatio).toBe(saved.defaults.focusGapStepRatio);
    const lenient = await currentChecks(faultyId, 3);
    expect(summary(lenient).filter((s) => s.startsWith('exposure-jump'))).toEqual([]);
    expect(summary(lenient)).toEqual(expect.arrayContaining(['duplicate-frame:8,9', 'focus-gap:12,13']));

    await put(as.owner, {}).expect(200);
    const strict = await currentChecks(faultyId, saved.defaults.exposureJumpStops);
    expect(summary(strict)).toEqual(EXPECTED);
  });

  it('refuse bad limits with the field named, and keep the saved ones', async () => {
    await put(as.photographer, { focusGapStepRatio: 2.5 }).expect(200);
    const cases: [unknown, string][] = [
      [{ exposureJumpStops: -1 }, 'exposureJumpStops'],
      [{ exposureJumpStops: 'a lot' }, 'exposureJumpStops'],
      [{ focusGapStepRatio: 1 }, 'focusGapStepRatio'],
      [{ planFrameTolerance: 1.5 }, 'planFrameTolerance'],
      [{ duplicateChangeRatio: null }, 'duplicateChangeRatio'],
    ];
    for (const [body, field] of cases) {
      const res = await put(as.photographer, body).expect(422);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details.map((d: { path: string }) => d.path), JSON.stringify(body)).toContain(field);
    }
    const unknown = await put(as.photographer, { exposureJumpStop: 0.5 }).expect(422);
    expect(unknown.body.error.message).toContain('exposureJumpStop');
    expect((await put(as.photographer, [1, 2]).expect(422)).body.error.code).toBe('validation_failed');
    const kept = (await as.guest.get(thresholdsUrl()).expect(200)).body as CheckThresholdsView;
    expect(kept.custom).toEqual({ focusGapStepRatio: 2.5 });
    await put(as.photographer, {}).expect(200);
  });

  it('are changed only by owners and photographers', async () => {
    expect((await put(as.guest, { exposureJumpStops: 1 })).status).toBe(403);
    expect((await put(as.retoucher, { exposureJumpStops: 1 })).status).toBe(403);
    const anon = await agentFor(app);
    expect((await put(anon, { exposureJumpStops: 1 })).status).toBe(401);
    expect(((await as.owner.get(thresholdsUrl()).expect(200)).body as CheckThresholdsView).custom).toEqual({});
  });
});

describe('who sees the checks', () => {
  it('guests read them; a retoucher only for stacks handed to them; other studios never', async () => {
    await currentChecks(faultyId, 1 / 3);
    expect(summary((await as.guest.get(stackUrl(faultyId, '/checks')).expect(200)).body)).toEqual(EXPECTED);
    expect((await as.retoucher.get(stackUrl(faultyId, '/checks'))).status).toBe(403);
    const stranger = await agentFor(app, (await createStudioWithRoles('Elsewhere')).users.owner);
    expect((await stranger.get(stackUrl(faultyId, '/checks'))).status).toBe(403);
    expect((await as.photographer.get(stackUrl('0d6c6f5e-4d0e-4c8e-9d55-000000000000', '/checks'))).status).toBe(404);
  });
});

describe('marks on the stack page and in the bundle', () => {
  it('give each flagged frame its check codes', async () => {
    const d = (await as.photographer.get(stackUrl(faultyId)).expect(200)).body as { frames: { id: string; number: number; checkCodes: string[] }[] };
    const marked = d.frames.filter((f) => f.checkCodes.length).map((f) => `${f.number}:${f.checkCodes.join('+')}`);
    expect(marked).toEqual(['4:exposure-jump', '8:duplicate-frame', '9:duplicate-frame', '12:focus-gap', '13:focus-gap']);
    // the same marks for the sorting page, for the whole session (the clean stack has none)
    const { storedCheckCodesForSession } = await import('../../server/services/check-results-service');
    const bySession = await storedCheckCodesForSession(sessionId);
    const ids = d.frames;
    expect(ids.filter((f) => bySession.has(f.id)).map((f) => `${f.number}:${bySession.get(f.id)!.join('+')}`)).toEqual(marked);
    expect(bySession.size).toBe(marked.length);
    // …and the sorting view carries them on its frames.
    const sorting = (await as.photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200)).body as { stacks: { id: string; frames: { checkCodes: string[] }[] }[] };
    const faulty = sorting.stacks.find((s) => s.id === faultyId)!;
    expect(faulty.frames.map((f, i) => (f.checkCodes.length ? `${i + 1}:${f.checkCodes.join('+')}` : null)).filter(Boolean)).toEqual(marked);
  });

  it('write the check codes as flags into the bundle manifest', async () => {
    const asked = await as.photographer.post(stackUrl(faultyId, '/bundles')).set('x-csrf-token', as.photographer.csrf).send({});
    expect([200, 202]).toContain(asked.status);
    const done = await until('bundle', async () => {
      const b = (await as.photographer.get(`/api/studios/${fx.studioId}/bundles/${asked.body.id}`).expect(200)).body as BundleView;
      if (b.status === 'failed') throw new Error(`bundle failed: ${b.error}`);
      return b.status === 'done' && b;
    });
    const zip = path.join(tmp, 'faulty.zip');
    fs.writeFileSync(zip, (await getBinary(as.photographer, `/api/studios/${fx.studioId}/bundles/${done.id}/download`).expect(200)).body as Buffer);
    expect(unzipTest(zip)).toMatch(/No errors detected/); // Info-ZIP unzip -t
    const out = path.join(tmp, 'faulty');
    unzipTo(zip, out);
    const manifest = JSON.parse(fs.readFileSync(path.join(out, 'manifest.json'), 'utf8')) as BundleManifest;
    const flagged = manifest.frames.filter((f) => f.flags.length).map((f) => `${f.number}:${f.flags.join('+')}`);
    expect(flagged).toEqual(['4:exposure-jump', '8:duplicate-frame', '9:duplicate-frame', '12:focus-gap', '13:focus-gap']);
    const legend = manifest.legend.filter((l) => ['exposure-jump', 'focus-gap', 'duplicate-frame'].includes(l.code)).map((l) => l.glyph);
    expect(legend.sort()).toEqual(['broken-bracket', 'half-filled-circle', 'two-stacked-bars']);
  });
});

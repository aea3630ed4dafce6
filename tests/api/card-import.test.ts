import { beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { BASE_TIME_MS, settings, taggedJpeg, taggedTiff } from '../helpers/card';

let app: Express;
let fx: StudioFixture;
let photographer: Agent;

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Import Studio');
  photographer = await agentFor(app, fx.users.photographer);
});

async function newSession(agent = photographer, studioId = fx.studioId) {
  const s = await agent.post(`/api/studios/${studioId}/sessions`).set('x-csrf-token', agent.csrf).send({ title: 'Dew on fern', shootDate: '2026-05-14', subject: 'fern frond' });
  expect(s.status).toBe(201);
  const imp = await agent.post(`/api/studios/${studioId}/sessions/${s.body.id}/imports`).set('x-csrf-token', agent.csrf).send({});
  expect(imp.status).toBe(201);
  return { sessionId: s.body.id as string, importId: imp.body.id as string };
}

function uploadTo(agent: Agent, sessionId: string, importId: string, files: { name: string; data: Buffer; mtimeMs?: number }[]) {
  const req = agent.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/imports/${importId}/files`).set('x-csrf-token', agent.csrf);
  for (const f of files) {
    req.field('lastModified', String(f.mtimeMs ?? ''));
    req.attach('files', f.data, { filename: f.name, contentType: 'application/octet-stream' });
  }
  return req;
}

describe('card import', () => {
  it('stores accepted files, refuses others by content with a reason, and skips duplicates', async () => {
    const { sessionId, importId } = await newSession();
    const jpeg = await taggedJpeg(settings(BASE_TIME_MS));
    const res = await uploadTo(photographer, sessionId, importId, [
      { name: 'FRN_0001.JPG', data: jpeg },
      { name: 'notes.jpg', data: Buffer.from('these are my notes, not a picture\n') },
      { name: 'empty.jpg', data: Buffer.alloc(0) },
      { name: 'FRN_0001 copy.JPG', data: jpeg },
      { name: 'tool.jpg', data: Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]), Buffer.alloc(64)]) },
    ]);
    expect(res.status).toBe(201);
    const by = Object.fromEntries(res.body.files.map((f: { name: string }) => [f.name, f]));
    expect(by['FRN_0001.JPG'].status).toBe('stored');
    expect(by['FRN_0001.JPG'].sha256).toBe(crypto.createHash('sha256').update(jpeg).digest('hex'));
    expect(by['notes.jpg']).toMatchObject({ status: 'refused', reason: expect.stringMatching(/text/) });
    expect(by['empty.jpg']).toMatchObject({ status: 'refused', reason: expect.stringMatching(/empty/) });
    expect(by['FRN_0001 copy.JPG'].status).toBe('duplicate');
    expect(by['tool.jpg']).toMatchObject({ status: 'refused', reason: expect.stringMatching(/executable/) });

    const known = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/known-hashes`).set('x-csrf-token', photographer.csrf)
      .send({ sha256: [by['FRN_0001.JPG'].sha256, 'a'.repeat(64)] });
    expect(known.body.known).toEqual([by['FRN_0001.JPG'].sha256]);
  });

  it('sorts a mixed card into stacks and loose frames, pairing RAW and JPEG', async () => {
    const { sessionId, importId } = await newSession();
    const files: { name: string; data: Buffer }[] = [];
    let t = BASE_TIME_MS;
    let n = 1;
    const shoot = async (count: number, stepS: number, over = {}, withRaw = false) => {
      for (let i = 0; i < count; i++) {
        const s = settings(t, over);
        const name = `FRN_${String(n).padStart(4, '0')}`;
        files.push({ name: `${name}.JPG`, data: await taggedJpeg(s, 100 + (n % 50)) });
        if (withRaw) files.push({ name: `${name}.TIF`, data: await taggedTiff(s, 60 + n) });
        n += 1;
        t += stepS * 1000;
      }
    };
    await shoot(12, 6); // stack 1: hand-focused, 6 s apart
    t += 5 * 60_000;
    await shoot(2, 20); // two test shots
    t += 5 * 60_000;
    await shoot(10, 4, { fNumber: 11 }, true); // stack 2 with RAW+JPEG pairs
    t += 4 * 60_000;
    await shoot(15, 0.4, { fNumber: 5.6 }); // stack 3: an automatic burst
    t += 6 * 60_000;
    await shoot(12, 5, { bodySerial: 'BODY-B-0002' }); // stack 4 on a second body
    expect(files.length).toBeGreaterThanOrEqual(60);
    const hashes = files.map((f) => crypto.createHash('sha256').update(f.data).digest('hex'));
    // The first attempt breaks off after three requests of 10 files, as the client sends them.
    for (let i = 0; i < 30; i += 10) {
      const res = await uploadTo(photographer, sessionId, importId, files.slice(i, i + 10));
      expect(res.status).toBe(201);
    }
    // Resuming: the client asks which files the session holds already and sends only the rest.
    const known = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/known-hashes`).set('x-csrf-token', photographer.csrf).send({ sha256: hashes });
    expect([...known.body.known].sort()).toEqual(hashes.slice(0, 30).sort());
    const rest = files.filter((_, i) => !known.body.known.includes(hashes[i]));
    expect(rest).toHaveLength(files.length - 30);
    for (let i = 0; i < rest.length; i += 10) {
      const res = await uploadTo(photographer, sessionId, importId, rest.slice(i, i + 10));
      expect(res.status).toBe(201);
      expect(res.body.files.every((f: { status: string }) => f.status === 'stored')).toBe(true);
    }
    // A repeat of the first batch and a renamed copy of one frame: nothing is stored twice.
    const again = await uploadTo(photographer, sessionId, importId, [...files.slice(0, 10), { name: 'FRN_0005 copy.JPG', data: files[4].data }]);
    expect(again.body.files.every((f: { status: string }) => f.status === 'duplicate')).toBe(true);
    const done = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/imports/${importId}/complete`).set('x-csrf-token', photographer.csrf).send({});
    expect(done.status).toBe(200);
    expect(done.body).toMatchObject({ storedCount: files.length, duplicateCount: 11, refusedCount: 0 });

    const sorting = await photographer.get(`/api/studios/${fx.studioId}/sessions/${sessionId}/sorting`).expect(200);
    expect(sorting.body.stacks.map((s: { frames: unknown[] }) => s.frames.length)).toEqual([12, 10, 15, 12]);
    expect(sorting.body.stacks.map((s: { startReason: string }) => s.startReason)).toEqual(['first', 'setting', 'setting', 'body']);
    expect(sorting.body.loose).toHaveLength(2);
    const paired = sorting.body.stacks[1].frames[0];
    expect(paired.files.map((f: { kind: string }) => f.kind).sort()).toEqual(['jpeg', 'tiff-raw']);
    const list = await photographer.get(`/api/studios/${fx.studioId}/sessions`).expect(200);
    expect(list.body.sessions.find((s: { id: string }) => s.id === sessionId)).toMatchObject({ frameCount: 51, stackCount: 4, looseCount: 2 });

    // A tighter gap rule splits nothing here but is remembered; undo brings back the arrangement.
    const regrouped = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/regroup`).set('x-csrf-token', photographer.csrf).send({ minStackSize: 20 });
    expect(regrouped.body.stacks).toHaveLength(0);
    expect(regrouped.body.loose).toHaveLength(51);
    const undone = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/undo`).set('x-csrf-token', photographer.csrf).send({});
    expect(undone.body.sorting.stacks.map((s: { frames: unknown[] }) => s.frames.length)).toEqual([12, 10, 15, 12]);
  });

  it('refuses guests and other studios, and bad multipart bodies with a clear message', async () => {
    const { sessionId, importId } = await newSession();
    const guest = await agentFor(app, fx.users.guest);
    const jpeg = await taggedJpeg(settings(BASE_TIME_MS));
    expect((await uploadTo(guest, sessionId, importId, [{ name: 'a.jpg', data: jpeg }])).status).toBe(403);
    const other = await createStudioWithRoles('Other');
    const stranger = await agentFor(app, other.users.photographer);
    const cross = await stranger.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/imports/${importId}/files`).set('x-csrf-token', stranger.csrf).attach('files', jpeg, 'a.jpg');
    expect(cross.status).toBe(403);
    const viaOwnStudio = await stranger.post(`/api/studios/${other.studioId}/sessions/${sessionId}/imports/${importId}/files`).set('x-csrf-token', stranger.csrf).attach('files', jpeg, 'a.jpg');
    expect(viaOwnStudio.status).toBe(404);
    const malformed = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/imports/${importId}/files`).set('x-csrf-token', photographer.csrf)
      .set('content-type', 'multipart/form-data; boundary=XYZ').send('--XYZ\r\nContent-Disposition: form-data; name="files"; filename="a.jpg"\r\n\r\nabc');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.message).toBeTruthy();
    const none = await photographer.post(`/api/studios/${fx.studioId}/sessions/${sessionId}/imports/${importId}/files`).set('x-csrf-token', photographer.csrf).send({});
    expect(none.status).toBe(400);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { BASE_TIME_MS, settings, taggedJpeg, taggedTiff } from '../helpers/card';
import { startTestWorkers, until } from '../helpers/worker';

let app: Express;
let fx: StudioFixture;
let agent: Agent;
let workers: { stop: () => Promise<void> };

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Preview Studio');
  agent = await agentFor(app, fx.users.photographer);
  workers = await startTestWorkers();
});
afterAll(async () => workers?.stop());

interface FrameV { id: string; previewStatus: string; files: { kind: string }[] }

describe('frame previews in the worker', () => {
  it('makes small and large previews and statistics for every frame, served to members', async () => {
    const base = `/api/studios/${fx.studioId}/sessions`;
    const s = await agent.post(base).set('x-csrf-token', agent.csrf).send({ title: 'Watch movement', shootDate: '2026-06-02' });
    const imp = await agent.post(`${base}/${s.body.id}/imports`).set('x-csrf-token', agent.csrf).send({});
    const req = agent.post(`${base}/${s.body.id}/imports/${imp.body.id}/files`).set('x-csrf-token', agent.csrf);
    for (let i = 0; i < 4; i++) req.attach('files', await taggedJpeg(settings(BASE_TIME_MS + i * 5000), 80 + i * 20), `WM_${i + 1}.JPG`);
    req.attach('files', await taggedTiff(settings(BASE_TIME_MS + 20_000)), 'WM_5.TIF');
    expect((await req).status).toBe(201);
    await agent.post(`${base}/${s.body.id}/imports/${imp.body.id}/complete`).set('x-csrf-token', agent.csrf).send({}).expect(200);

    const frames = await until('previews', async () => {
      const v = await agent.get(`${base}/${s.body.id}/sorting`);
      const all: FrameV[] = [...v.body.stacks.flatMap((x: { frames: FrameV[] }) => x.frames), ...v.body.loose];
      return all.length === 5 && all.every((f) => f.previewStatus === 'done') && all;
    });
    for (const f of frames) {
      const small = await agent.get(`${base}/${s.body.id}/frames/${f.id}/preview/small`).buffer(true).parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => cb(null, Buffer.concat(chunks)));
      });
      expect(small.status).toBe(200);
      expect(small.headers['content-type']).toBe('image/jpeg');
      const meta = await sharp(small.body as Buffer).metadata();
      expect(meta.format).toBe('jpeg');
      expect(Math.max(meta.width ?? 0, meta.height ?? 0)).toBeLessThanOrEqual(320);
    }
    const { getDataSource } = await import('../../server/lib/data-source');
    const rows: { stats: { sharpnessGrid: number[]; meanLuminance: number } }[] = await getDataSource().query(`SELECT stats FROM frames WHERE session_id = $1`, [s.body.id]);
    expect(rows).toHaveLength(5);
    for (const r of rows) {
      expect(r.stats.sharpnessGrid).toHaveLength(48);
      expect(r.stats.meanLuminance).toBeGreaterThan(0);
    }
    const other = await createStudioWithRoles('Nosy');
    const nosy = await agentFor(app, other.users.owner);
    expect((await nosy.get(`${base}/${s.body.id}/frames/${frames[0].id}/preview/small`)).status).toBe(403);
  });
});

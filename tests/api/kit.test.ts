import { beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';

let app: Express;
let fx: StudioFixture;
let other: StudioFixture;
const as = {} as Record<'owner' | 'photographer' | 'retoucher' | 'guest' | 'stranger', Agent>;

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Kit Studio');
  other = await createStudioWithRoles('Other Kit Studio');
  for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) as[role] = await agentFor(app, fx.users[role]);
  as.stranger = await agentFor(app, other.users.owner);
});

const kitUrl = (path = '', studioId = fx.studioId) => `/api/studios/${studioId}/kit${path}`;
const post = (a: Agent, path: string, body: unknown, studioId?: string) => a.post(kitUrl(path, studioId)).set('x-csrf-token', a.csrf).send(body as object);
const patch = (a: Agent, path: string, body: unknown, studioId?: string) => a.patch(kitUrl(path, studioId)).set('x-csrf-token', a.csrf).send(body as object);
const del = (a: Agent, path: string, studioId?: string) => a.delete(kitUrl(path, studioId)).set('x-csrf-token', a.csrf);
const paths = (res: { body: { error: { details?: { path: string }[] } } }) => (res.body.error.details ?? []).map((d) => d.path);

describe('bodies', () => {
  it.each([
    // common practice: the format sizes as the formats are usually quoted, in mm.
    ['full-frame', 36, 24],
    ['aps-c-23.5', 23.5, 15.6],
    ['aps-c-22.3', 22.3, 14.9],
    ['four-thirds', 17.3, 13],
    ['one-inch', 13.2, 8.8],
  ])('a %s body takes its sensor size from the format, whatever size is sent', async (sensorFormat, widthMm, heightMm) => {
    const res = await post(as.photographer, '/bodies', { name: `Body ${sensorFormat}`, sensorFormat, sensorWidthMm: 99, sensorHeightMm: 99, pixelsAcross: 6000 }).expect(201);
    expect(res.body).toMatchObject({ sensorFormat, sensorWidthMm: widthMm, sensorHeightMm: heightMm, pixelsAcross: 6000 });
  });

  it('keeps a custom sensor size and asks for both dimensions', async () => {
    const ok = await post(as.owner, '/bodies', { name: 'Custom body', sensorFormat: 'custom', sensorWidthMm: 44, sensorHeightMm: 33, pixelsAcross: 8000 }).expect(201);
    expect(ok.body).toMatchObject({ sensorWidthMm: 44, sensorHeightMm: 33 });
    const bad = await post(as.owner, '/bodies', { name: 'Custom body', sensorFormat: 'custom', pixelsAcross: 8000 }).expect(422);
    expect(paths(bad).sort()).toEqual(['sensorHeightMm', 'sensorWidthMm']);
    expect(bad.body.error.details[0].message).toMatch(/custom size/);
  });

  it('answers every out-of-range field with its path and a readable message', async () => {
    const res = await post(as.photographer, '/bodies', { name: '  ', sensorFormat: 'medium', pixelsAcross: 12.5 }).expect(422);
    expect(res.body.error.code).toBe('validation_failed');
    expect(paths(res).sort()).toEqual(['name', 'pixelsAcross', 'sensorFormat']);
    expect(res.body.error.details.find((d: { path: string }) => d.path === 'pixelsAcross').message).toBe('Pixels across is a whole number.');
  });
});

describe('lenses, extension sets and rails', () => {
  it('defaults the pupil magnification to 1 and refuses a narrowest f-number below the widest', async () => {
    const lens = await post(as.photographer, '/lenses', { name: '100 mm macro', focalLengthMm: 100, widestFNumber: 2.8, narrowestFNumber: 22, maxMagnification: 1 }).expect(201);
    expect(lens.body.pupilMagnification).toBe(1);
    const bad = await post(as.photographer, '/lenses', { name: 'Odd lens', focalLengthMm: 0, widestFNumber: 8, narrowestFNumber: 4, maxMagnification: -1 }).expect(422);
    // Range errors and the order check are reported together, so the form can mark every field at once.
    expect(paths(bad).sort()).toEqual(['focalLengthMm', 'maxMagnification', 'narrowestFNumber']);
    const order = await post(as.photographer, '/lenses', { name: 'Odd lens', focalLengthMm: 50, widestFNumber: 8, narrowestFNumber: 4, maxMagnification: 0.15 }).expect(422);
    expect(paths(order)).toEqual(['narrowestFNumber']);
  });

  it('stores tube lengths as numbers in order and names a bad tube by its position', async () => {
    const set = await post(as.photographer, '/extension-sets', { name: 'Tube set', tubeLengthsMm: [12, 20, 36] }).expect(201);
    expect(set.body.tubeLengthsMm).toEqual([12, 20, 36]);
    const bad = await post(as.photographer, '/extension-sets', { name: 'Tube set', tubeLengthsMm: [12, -20] }).expect(422);
    expect(paths(bad)).toEqual(['tubeLengthsMm.1']);
    const empty = await post(as.photographer, '/extension-sets', { name: 'No tubes', tubeLengthsMm: [] }).expect(422);
    expect(paths(empty)).toEqual(['tubeLengthsMm']);
  });

  it('refuses a rail whose smallest step is longer than its travel', async () => {
    await post(as.photographer, '/rails', { name: 'Fine rail', travelMm: 50, smallestStepUm: 5 }).expect(201);
    const bad = await post(as.photographer, '/rails', { name: 'Short rail', travelMm: 0.002, smallestStepUm: 5 }).expect(422);
    expect(paths(bad)).toEqual(['smallestStepUm']);
  });
});

describe('who may do what', () => {
  it('lets every member read the whole kit, and only owners and photographers change it', async () => {
    await post(as.photographer, '/rails', { name: 'Read rail', travelMm: 80, smallestStepUm: 2 }).expect(201);
    for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) {
      const kit = await as[role].get(kitUrl()).expect(200);
      expect(Object.keys(kit.body).sort()).toEqual(['bodies', 'extensionSets', 'lenses', 'rails']);
      expect(kit.body.rails.map((r: { name: string }) => r.name)).toContain('Read rail');
    }
    const rail = { name: 'Guest rail', travelMm: 10, smallestStepUm: 1 };
    await post(as.guest, '/rails', rail).expect(403);
    await post(as.retoucher, '/rails', rail).expect(403);
    const list = await as.guest.get(kitUrl('/rails')).expect(200);
    const id = list.body.items[0].id;
    await patch(as.guest, `/rails/${id}`, { name: 'Renamed' }).expect(403);
    await del(as.retoucher, `/rails/${id}`).expect(403);
  });

  it('keeps one studio’s kit out of another studio’s reach', async () => {
    const lens = await post(as.photographer, '/lenses', { name: 'Private lens', focalLengthMm: 50, widestFNumber: 1.8, narrowestFNumber: 16, maxMagnification: 0.15 }).expect(201);
    await as.stranger.get(kitUrl()).expect(403);
    await patch(as.stranger, `/lenses/${lens.body.id}`, { name: 'Taken' }).expect(403);
    // Through the stranger's own studio the id is simply not there.
    await patch(as.stranger, `/lenses/${lens.body.id}`, { name: 'Taken' }, other.studioId).expect(404);
    await del(as.stranger, `/lenses/${lens.body.id}`, other.studioId).expect(404);
    const still = await as.owner.get(kitUrl('/lenses')).expect(200);
    expect(still.body.items.find((l: { id: string }) => l.id === lens.body.id).name).toBe('Private lens');
  });
});

describe('editing and deleting', () => {
  it('changes only what is sent, and a bad change leaves the item as it was', async () => {
    const lens = await post(as.owner, '/lenses', { name: '50 mm', focalLengthMm: 50, widestFNumber: 1.8, narrowestFNumber: 16, maxMagnification: 0.15, pupilMagnification: 0.9 }).expect(201);
    const renamed = await patch(as.photographer, `/lenses/${lens.body.id}`, { name: '50 mm normal' }).expect(200);
    expect(renamed.body).toMatchObject({ name: '50 mm normal', focalLengthMm: 50, pupilMagnification: 0.9 });
    const before = (await as.owner.get(kitUrl('/lenses')).expect(200)).body.items.find((l: { id: string }) => l.id === lens.body.id);
    for (const change of [{ focalLengthMm: 5000 }, { widestFNumber: 22 }, { name: '' }, { pupilMagnification: 'one' }]) {
      await patch(as.photographer, `/lenses/${lens.body.id}`, change).expect(422);
    }
    const after = (await as.owner.get(kitUrl('/lenses')).expect(200)).body.items.find((l: { id: string }) => l.id === lens.body.id);
    expect(after).toEqual(before);
  });

  it('switches a body between a preset and a custom size', async () => {
    const body = await post(as.owner, '/bodies', { name: 'Switching body', sensorFormat: 'four-thirds', pixelsAcross: 5184 }).expect(201);
    const custom = await patch(as.owner, `/bodies/${body.body.id}`, { sensorFormat: 'custom', sensorWidthMm: 17.4 }).expect(200);
    expect(custom.body).toMatchObject({ sensorFormat: 'custom', sensorWidthMm: 17.4, sensorHeightMm: 13 });
    const back = await patch(as.owner, `/bodies/${body.body.id}`, { sensorFormat: 'one-inch' }).expect(200);
    expect(back.body).toMatchObject({ sensorWidthMm: 13.2, sensorHeightMm: 8.8 });
  });

  it('deletes an item once; a second delete and an id that is not a uuid are 404', async () => {
    const set = await post(as.photographer, '/extension-sets', { name: 'Spare tubes', tubeLengthsMm: [10, 16] }).expect(201);
    await del(as.photographer, `/extension-sets/${set.body.id}`).expect(204);
    const kit = await as.guest.get(kitUrl()).expect(200);
    expect(kit.body.extensionSets.map((s: { id: string }) => s.id)).not.toContain(set.body.id);
    await del(as.photographer, `/extension-sets/${set.body.id}`).expect(404);
    await patch(as.photographer, '/extension-sets/not-a-uuid', { name: 'x' }).expect(404);
  });
});

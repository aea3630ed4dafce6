import { beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { apertureSweep, planStack } from '@shared/optics';
import type { PlanInput } from '@shared/schemas/plan-input';

let app: Express;
let fx: StudioFixture;
let other: StudioFixture;
const as = {} as Record<'owner' | 'photographer' | 'retoucher' | 'guest' | 'stranger', Agent>;
const kit = {} as { bodyId: string; lensId: string; extensionSetId: string; railId: string };

// Our fern scenario: a 50 mm lens at infinity on 25 mm of tubes, APS-C body, 4 mm of dew-covered frond.
const fernInputs: PlanInput = {
  focalLengthMm: 50,
  extensionMm: 25,
  fNumber: 8,
  cocMm: 0.03,
  sensor: { widthMm: 23.5, heightMm: 15.6, pixelsAcross: 3872 },
  depthMm: 4,
  overlap: 0.2,
  dofModel: 'geometric',
  railStepUm: 5,
  secondsPerFrame: 2,
  exposureTimeS: 0.5,
  stableSeconds: 300,
};

const base = (studioId = fx.studioId) => `/api/studios/${studioId}/plans`;
const send = (a: Agent, method: 'post' | 'patch', url: string, body: unknown = {}) => a[method](url).set('x-csrf-token', a.csrf).send(body as object);
const paths = (res: { body: { error: { details?: { path: string }[] } } }) => (res.body.error.details ?? []).map((d) => d.path).sort();

function fernPlan(extra: Record<string, unknown> = {}) {
  return {
    name: 'Dew on a fern frond',
    notes: 'Morning light, diffuser left.',
    inputs: fernInputs,
    kit: { ...kit, tubeIndexes: [0, 1] },
    focusingMethod: 'rail',
    ...extra,
  };
}

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Plan Studio');
  other = await createStudioWithRoles('Other Plan Studio');
  for (const role of ['owner', 'photographer', 'retoucher', 'guest'] as const) as[role] = await agentFor(app, fx.users[role]);
  as.stranger = await agentFor(app, other.users.owner);
  const k = (path: string, body: object) => send(as.photographer, 'post', `/api/studios/${fx.studioId}/kit/${path}`, body).expect(201).then((r) => r.body.id as string);
  kit.bodyId = await k('bodies', { name: 'APS-C body (10 MP)', sensorFormat: 'aps-c-23.5', pixelsAcross: 3872 });
  kit.lensId = await k('lenses', { name: '50 mm lens', focalLengthMm: 50, widestFNumber: 1.8, narrowestFNumber: 16, maxMagnification: 0.15 });
  kit.extensionSetId = await k('extension-sets', { name: 'Tubes', tubeLengthsMm: [5, 20, 36] });
  kit.railId = await k('rails', { name: 'Rail', travelMm: 50, smallestStepUm: 5 });
});

describe('saving a plan', () => {
  it('computes the figures on the server and ignores the ones the client sends', async () => {
    const forged = { magnification: 9, frames: 1, stepMm: 3, positionsMm: [0] };
    const res = await send(as.photographer, 'post', base(), fernPlan({ result: forged, sweep: { rows: [] }, ...forged })).expect(201);
    const { result, sweep } = res.body;
    // Thin lens (extension-tube tutorials): 25 mm on a 50 mm lens at infinity gives 0.5×.
    expect(result.magnification).toBeCloseTo(0.5, 12);
    // Wikipedia, "F-number": N_w = N · (1 + m/P) = 8 · 1.5 = 12.
    expect(result.workingFNumber).toBeCloseTo(12, 12);
    // Wikipedia, "Depth of field" (close-up): DOF = 2Nc(1 + m/P) / (m² − (Nc/f)²), worked here by hand.
    const dofMm = (2 * 8 * 0.03 * 1.5) / (0.5 ** 2 - ((8 * 0.03) / 50) ** 2);
    expect(result.frameDofMm).toBeCloseTo(dofMm, 9);
    // Step rounded down to whole 5 µm rail steps, then n = ⌈depth / step⌉ + 1 (PRODUCT.md, Optics).
    const stepMm = (Math.floor((dofMm * 0.8 * 1000) / 5) * 5) / 1000;
    expect(result.stepMm).toBeCloseTo(stepMm, 12);
    expect(result.frames).toBe(Math.ceil(4 / stepMm) + 1);
    expect(result).toEqual(planStack(fernInputs));
    expect(sweep).toEqual(apertureSweep(fernInputs));
    expect(res.body.kit).toEqual({ ...kit, tubeIndexes: [0, 1] });
    expect(res.body.sessionId).toBeNull();
    const stored = await as.guest.get(`${base()}/${res.body.id}`).expect(200);
    expect(stored.body.result).toEqual(result);
  });

  it('answers each out-of-range field with its path and saves nothing', async () => {
    const before = (await as.owner.get(base()).expect(200)).body.plans.length;
    const bad = await send(as.photographer, 'post', base(), fernPlan({
      name: '',
      focusingMethod: 'tripod',
      inputs: { ...fernInputs, focalLengthMm: 0, overlap: 1.5, sensor: { ...fernInputs.sensor, pixelsAcross: 10.5 }, depthMm: 'deep' },
    })).expect(422);
    expect(bad.body.error.code).toBe('validation_failed');
    expect(paths(bad)).toEqual(['focusingMethod', 'inputs.depthMm', 'inputs.focalLengthMm', 'inputs.overlap', 'inputs.sensor.pixelsAcross', 'name']);
    for (const d of bad.body.error.details) expect(d.message.length).toBeGreaterThan(5);
    expect((await as.owner.get(base()).expect(200)).body.plans.length).toBe(before);
  });

  it('checks the focusing method against the rail step, and the kit against the studio', async () => {
    const noStep = await send(as.photographer, 'post', base(), fernPlan({ inputs: { ...fernInputs, railStepUm: undefined } })).expect(422);
    expect(paths(noStep)).toEqual(['inputs.railStepUm']);
    const cameraWithStep = await send(as.photographer, 'post', base(), fernPlan({ focusingMethod: 'camera' })).expect(422);
    expect(paths(cameraWithStep)).toEqual(['inputs.railStepUm']);
    const foreign = await send(as.photographer, 'post', base(), fernPlan({ kit: { ...kit, bodyId: crypto.randomUUID() } })).expect(422);
    expect(paths(foreign)).toEqual(['kit.bodyId']);
    const noTube = await send(as.photographer, 'post', base(), fernPlan({ kit: { ...kit, tubeIndexes: [3] } })).expect(422);
    expect(paths(noTube)).toEqual(['kit.tubeIndexes']);
    const typed = await send(as.photographer, 'post', base(), fernPlan({ kit: undefined, focusingMethod: 'camera', inputs: { ...fernInputs, railStepUm: undefined } })).expect(201);
    expect(typed.body.kit).toEqual({ bodyId: null, lensId: null, extensionSetId: null, tubeIndexes: [], railId: null });
    expect(typed.body.result.railSteps).toBeNull();
  });
});

describe('changing a plan', () => {
  it('leaves the stored plan identical when a change is refused', async () => {
    const created = await send(as.photographer, 'post', base(), fernPlan()).expect(201);
    const url = `${base()}/${created.body.id}`;
    const before = (await as.owner.get(url).expect(200)).body;
    const refused = [
      { inputs: { ...fernInputs, fNumber: 500 } },
      { inputs: { ...fernInputs, secondsPerFrame: 0.1 } }, // shorter than the exposure
      { name: 'Renamed', inputs: { ...fernInputs, depthMm: -1 } },
      { focusingMethod: 'camera' },
      { sessionId: 'not-a-session' },
      { kit: { ...kit, railId: crypto.randomUUID() } },
    ];
    for (const change of refused) {
      const res = await send(as.photographer, 'patch', url, change).expect(422);
      expect(res.body.error.details.length).toBeGreaterThan(0);
    }
    const after = (await as.owner.get(url).expect(200)).body;
    expect(after).toEqual(before);
  });

  it('recomputes on change, keeps what was not sent, and links and unlinks a session', async () => {
    const created = await send(as.photographer, 'post', base(), fernPlan({ name: 'Watch movement' })).expect(201);
    const url = `${base()}/${created.body.id}`;
    const inputs = { ...fernInputs, fNumber: 5.6 };
    const changed = await send(as.owner, 'patch', url, { inputs, result: { frames: 2 } }).expect(200);
    expect(changed.body.result).toEqual(planStack(inputs));
    expect(changed.body.result.frames).toBeGreaterThan(created.body.result.frames); // a wider aperture needs more frames
    expect(changed.body).toMatchObject({ name: 'Watch movement', notes: created.body.notes, focusingMethod: 'rail' });
    const sessionId = crypto.randomUUID();
    expect((await send(as.photographer, 'patch', url, { sessionId }).expect(200)).body.sessionId).toBe(sessionId);
    expect((await send(as.photographer, 'patch', url, { sessionId: null }).expect(200)).body.sessionId).toBeNull();
  });

  it('duplicates a plan under a new name with the same inputs and figures', async () => {
    const created = await send(as.photographer, 'post', base(), fernPlan({ name: 'Museum beetle', sessionId: crypto.randomUUID() })).expect(201);
    const copy = await send(as.photographer, 'post', `${base()}/${created.body.id}/duplicate`).expect(201);
    expect(copy.body.id).not.toBe(created.body.id);
    expect(copy.body.name).toBe('Museum beetle (copy)');
    expect(copy.body.sessionId).toBeNull();
    expect(copy.body.inputs).toEqual(created.body.inputs);
    expect(copy.body.result).toEqual(created.body.result);
    const list = (await as.guest.get(base()).expect(200)).body.plans;
    expect(list[0]).toMatchObject({ id: copy.body.id, name: 'Museum beetle (copy)', frames: created.body.result.frames, magnification: 0.5 });
    expect(list[0].stepMm).toBeCloseTo(created.body.result.stepMm, 12);
  });

  it('deletes a plan', async () => {
    const created = await send(as.photographer, 'post', base(), fernPlan({ name: 'Short-lived' })).expect(201);
    await as.owner.delete(`${base()}/${created.body.id}`).set('x-csrf-token', as.owner.csrf).expect(204);
    await as.owner.get(`${base()}/${created.body.id}`).expect(404);
    await as.owner.get(`${base()}/not-a-uuid`).expect(404);
  });
});

describe('roles and studios', () => {
  it('lets guests and retouchers read plans but not write them', async () => {
    const created = await send(as.photographer, 'post', base(), fernPlan({ name: 'Shared read-only' })).expect(201);
    const url = `${base()}/${created.body.id}`;
    for (const reader of [as.guest, as.retoucher]) {
      expect((await reader.get(url).expect(200)).body.name).toBe('Shared read-only');
      expect((await reader.get(base()).expect(200)).body.plans.map((p: { id: string }) => p.id)).toContain(created.body.id);
      await send(reader, 'post', base(), fernPlan()).expect(403);
      await send(reader, 'patch', url, { name: 'Mine now' }).expect(403);
      await send(reader, 'post', `${url}/duplicate`).expect(403);
      await reader.delete(url).set('x-csrf-token', reader.csrf).expect(403);
    }
    expect((await as.owner.get(url).expect(200)).body.name).toBe('Shared read-only');
  });

  it('refuses another studio, and does not find this studio’s plan through another studio', async () => {
    const created = await send(as.photographer, 'post', base(), fernPlan({ name: 'Ours' })).expect(201);
    await as.stranger.get(base()).expect(403);
    await as.stranger.get(`${base()}/${created.body.id}`).expect(403);
    await send(as.stranger, 'patch', `${base()}/${created.body.id}`, { name: 'Theirs' }).expect(403);
    await as.stranger.get(`${base(other.studioId)}/${created.body.id}`).expect(404);
    await send(as.stranger, 'patch', `${base(other.studioId)}/${created.body.id}`, { name: 'Theirs' }).expect(404);
    // The stranger's own studio cannot borrow our kit by id either.
    const borrowed = await send(as.stranger, 'post', base(other.studioId), fernPlan()).expect(422);
    expect(paths(borrowed)).toEqual(['kit.bodyId']);
  });
});

describe('preview', () => {
  it('computes without saving, for any member, with the same engine', async () => {
    const before = (await as.owner.get(base()).expect(200)).body.plans.length;
    const res = await send(as.guest, 'post', `${base()}/preview`, { inputs: fernInputs, focusingMethod: 'rail' }).expect(200);
    expect(res.body.result).toEqual(planStack(fernInputs));
    expect(res.body.sweep.recommendedFNumber).toBe(apertureSweep(fernInputs).recommendedFNumber);
    const bad = await send(as.guest, 'post', `${base()}/preview`, { inputs: { ...fernInputs, overlap: -0.1 }, focusingMethod: 'rail' }).expect(422);
    expect(paths(bad)).toEqual(['inputs.overlap']);
    expect((await as.owner.get(base()).expect(200)).body.plans.length).toBe(before);
  });
});

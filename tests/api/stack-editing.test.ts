import { beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { sessionWithCard, sessionsBase, shootBursts, type CardFileSpec, type SortingV, type StackV } from '../helpers/sessions';

let app: Express;
let fx: StudioFixture;
let photographer: Agent;
let card: CardFileSpec[];

// Three hand-focused stacks 6 s a frame, minutes apart, and two test shots between the first two.
const BURSTS = [{ count: 6, stepS: 6 }, { count: 2, stepS: 40 }, { count: 5, stepS: 6 }, { count: 4, stepS: 6 }];

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Sorting Studio');
  photographer = await agentFor(app, fx.users.photographer);
  card = await shootBursts(BURSTS);
});

async function freshSession() {
  const { sessionId, sorting } = await sessionWithCard(photographer, fx.studioId, card);
  expect(sorting.stacks.map((s) => s.frames.length)).toEqual([6, 5, 4]);
  expect(sorting.loose).toHaveLength(2);
  return { sessionId, sorting };
}

function call(agent: Agent, method: 'post' | 'patch', sessionId: string, path: string, body: object = {}, studioId = fx.studioId) {
  return agent[method](`${sessionsBase(studioId)}/${sessionId}${path}`).set('x-csrf-token', agent.csrf).send(body);
}

async function undo(sessionId: string): Promise<{ undone: string; sorting: SortingV }> {
  const res = await call(photographer, 'post', sessionId, '/undo');
  expect(res.status).toBe(200);
  return res.body;
}

/** The arrangement only (ids of stacks, names, states, frame ids in order, exclusions, loose frames). */
const arrangement = (v: SortingV) => ({
  stacks: v.stacks.map((s) => ({ id: s.id, name: s.name, state: s.state, planId: s.planId, frames: s.frames.map((f) => `${f.id}${f.excluded ? ':x' : ''}`) })),
  loose: v.loose.map((f) => f.id).sort(),
});

async function events(stackId: string): Promise<{ action: string; actor_label: string; actor_id: string; detail: Record<string, unknown> }[]> {
  const { getDataSource } = await import('../../server/lib/data-source');
  return getDataSource().query(`SELECT action, actor_label, actor_id, detail FROM stack_events WHERE stack_id = $1 ORDER BY at, action`, [stackId]);
}

async function countRows(sessionId: string) {
  const { getDataSource } = await import('../../server/lib/data-source');
  const [r] = await getDataSource().query(
    `SELECT (SELECT count(*) FROM stored_files WHERE session_id = $1)::int AS files, (SELECT count(*) FROM frames WHERE session_id = $1)::int AS frames`,
    [sessionId],
  );
  return r as { files: number; frames: number };
}

async function setStateInDb(stackId: string, state: string) {
  const { getDataSource } = await import('../../server/lib/data-source');
  await getDataSource().query(`UPDATE stacks SET state = $2 WHERE id = $1`, [stackId, state]);
}

const versionOf = (v: SortingV, id: string) => v.stacks.find((s) => s.id === id)!.version;

describe('splitting and merging stacks', () => {
  it('splits at a frame into a new stack right after, and undo brings the stack back whole', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    const res = await call(photographer, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: a.frames[2].id });
    expect(res.status).toBe(200);
    const v: SortingV = res.body;
    expect(v.stacks.map((s) => s.frames.length)).toEqual([2, 4, 5, 4]);
    expect(v.stacks[0].id).toBe(a.id);
    expect(v.stacks[1]).toMatchObject({ name: `${a.name} (2)`, startReason: 'split', state: 'draft', position: 1 });
    expect(v.stacks[1].frames.map((f) => f.id)).toEqual(a.frames.slice(2).map((f) => f.id));
    expect(v.stacks.map((s) => s.position)).toEqual([0, 1, 2, 3]);
    expect(versionOf(v, a.id)).toBe(a.version + 1);
    expect(v.undoLabel).toBe(`split ${a.name}`);
    const log = await events(a.id);
    expect(log.at(-1)).toMatchObject({ action: 'split', actor_id: fx.users.photographer.id, actor_label: 'Test photographer', detail: { framesMoved: 4 } });

    const back = await undo(sessionId);
    expect(back.undone).toBe(`split ${a.name}`);
    expect(arrangement(back.sorting)).toEqual(arrangement(sorting));
    expect(versionOf(back.sorting, a.id)).toBeGreaterThan(versionOf(v, a.id)); // undo is a change too
  });

  it('refuses to split at the first frame or at a frame of another stack, with a clear message', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b] = sorting.stacks;
    const first = await call(photographer, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: a.frames[0].id });
    expect(first.status).toBe(422);
    expect(first.body.error.message).toMatch(/first frame.*Split at a later frame/);
    expect(first.body.error.details[0].path).toBe('frameId');
    const elsewhere = await call(photographer, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: b.frames[1].id });
    expect(elsewhere.status).toBe(422);
    expect(elsewhere.body.error.message).toMatch(/not in stack/);
    expect((await call(photographer, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: 'frame-3' })).status).toBe(422);
    expect((await call(photographer, 'post', sessionId, `/stacks/${crypto.randomUUID()}/split`, { frameId: a.frames[1].id })).status).toBe(404);
    const after = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200);
    expect(arrangement(after.body)).toEqual(arrangement(sorting));
    expect(after.body.undoLabel).toBe('card import'); // refused edits leave no undo step
  });

  it('merges a stack with the next one, keeps a plan link from either, and undo restores both', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b, c] = sorting.stacks;
    const res = await call(photographer, 'post', sessionId, `/stacks/${a.id}/merge-next`);
    expect(res.status).toBe(200);
    const v: SortingV = res.body;
    expect(v.stacks.map((s) => s.id)).toEqual([a.id, c.id]);
    expect(v.stacks[0].frames.map((f) => f.id)).toEqual([...a.frames, ...b.frames].map((f) => f.id));
    expect(v.stacks.map((s) => s.position)).toEqual([0, 1]);
    expect(versionOf(v, a.id)).toBe(a.version + 1);
    expect((await events(a.id)).at(-1)).toMatchObject({ action: 'merged', detail: { absorbedStackId: b.id, framesAdded: 5 } });
    const last = await call(photographer, 'post', sessionId, `/stacks/${c.id}/merge-next`);
    expect(last.status).toBe(422);
    expect(last.body.error.message).toMatch(/last stack/);
    const back = await undo(sessionId);
    expect(back.undone).toBe(`merge ${a.name} with ${b.name}`);
    expect(arrangement(back.sorting)).toEqual(arrangement(sorting));
  });
});

describe('moving and excluding frames', () => {
  it('moves loose frames into a stack by capture time, frames out to loose, and removes an emptied stack', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b, c] = sorting.stacks;
    const intoB = await call(photographer, 'post', sessionId, '/frames/move', { frameIds: sorting.loose.map((f) => f.id), toStackId: b.id });
    expect(intoB.status).toBe(200);
    const vb: StackV = intoB.body.stacks.find((s: StackV) => s.id === b.id);
    // The test shots were taken before stack B, so capture order puts them first.
    expect(vb.frames.map((f) => f.id)).toEqual([...sorting.loose, ...b.frames].map((f) => f.id));
    expect(vb.frames.map((f) => f.captureTimeMs)).toEqual([...vb.frames.map((f) => f.captureTimeMs)].sort((x, y) => x! - y!));
    expect(intoB.body.loose).toHaveLength(0);
    expect(vb.version).toBe(b.version + 1);

    const toLoose = await call(photographer, 'post', sessionId, '/frames/move', { frameIds: [a.frames[5].id], toStackId: null });
    expect(toLoose.status).toBe(200);
    expect(toLoose.body.loose.map((f: { id: string }) => f.id)).toEqual([a.frames[5].id]);
    expect((await events(a.id)).at(-1)).toMatchObject({ action: 'frames-moved-out', detail: { frameIds: [a.frames[5].id], toStackId: null } });

    const emptyC = await call(photographer, 'post', sessionId, '/frames/move', { frameIds: c.frames.map((f) => f.id), toStackId: a.id });
    expect(emptyC.status).toBe(200);
    expect(emptyC.body.stacks.map((s: StackV) => s.id)).toEqual([a.id, b.id]);
    expect(emptyC.body.stacks.find((s: StackV) => s.id === a.id).frames).toHaveLength(5 + 4);
    expect(await countRows(sessionId)).toEqual({ files: card.length, frames: card.length }); // nothing deleted

    for (let i = 0; i < 3; i++) await undo(sessionId);
    const back = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200);
    expect(arrangement(back.body)).toEqual(arrangement(sorting));
  });

  it('answers unknown frames with 404, frames already there and empty selections with 422', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b] = sorting.stacks;
    const unknown = await call(photographer, 'post', sessionId, '/frames/move', { frameIds: [a.frames[0].id, crypto.randomUUID()], toStackId: b.id });
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/1 of the selected frames is not in this session/);
    const already = await call(photographer, 'post', sessionId, '/frames/move', { frameIds: [a.frames[0].id], toStackId: a.id });
    expect(already.status).toBe(422);
    expect(already.body.error.message).toMatch(/already in/);
    expect((await call(photographer, 'post', sessionId, '/frames/move', { frameIds: [], toStackId: null })).status).toBe(422);
    expect((await call(photographer, 'post', sessionId, '/frames/move', { frameIds: ['../etc'], toStackId: null })).status).toBe(422);
    expect((await call(photographer, 'post', sessionId, '/frames/move', { frameIds: [a.frames[0].id], toStackId: crypto.randomUUID() })).status).toBe(404);
    // Frames of another session of the same studio are unknown here.
    const other = await freshSession();
    const foreign = await call(photographer, 'post', sessionId, '/frames/move', { frameIds: [other.sorting.stacks[0].frames[0].id], toStackId: null });
    expect(foreign.status).toBe(404);
  });

  it('excludes a frame (it stays in its stack, marked) and includes it again; undo reverts', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    const res = await call(photographer, 'post', sessionId, '/frames/exclusion', { frameIds: [a.frames[3].id], excluded: true });
    expect(res.status).toBe(200);
    const va: StackV = res.body.stacks[0];
    expect(va.frames).toHaveLength(6);
    expect(va.frames[3]).toMatchObject({ id: a.frames[3].id, excluded: true });
    expect(va.version).toBe(a.version + 1);
    expect(res.body.undoLabel).toBe('exclude 1 frame');
    expect((await events(a.id)).at(-1)).toMatchObject({ action: 'frames-excluded', detail: { frameIds: [a.frames[3].id] } });
    const back = await undo(sessionId);
    expect(back.sorting.stacks[0].frames[3].excluded).toBe(false);
    await call(photographer, 'post', sessionId, '/frames/exclusion', { frameIds: [a.frames[3].id], excluded: true }).expect(200);
    const included = await call(photographer, 'post', sessionId, '/frames/exclusion', { frameIds: [a.frames[3].id], excluded: false });
    expect(included.body.stacks[0].frames[3].excluded).toBe(false);
    expect((await events(a.id)).at(-1)?.action).toBe('frames-included');
    expect((await call(photographer, 'post', sessionId, '/frames/exclusion', { frameIds: [a.frames[3].id], excluded: 'yes' })).status).toBe(422);
  });
});

describe('naming, plans, order and state', () => {
  it('renames, refuses a taken or unprintable name, and undo restores the old name', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b] = sorting.stacks;
    const res = await call(photographer, 'patch', sessionId, `/stacks/${a.id}`, { name: '  Fern frond, left side  ' });
    expect(res.status).toBe(200);
    expect(res.body.stacks[0]).toMatchObject({ name: 'Fern frond, left side', version: a.version + 1 });
    expect((await events(a.id)).at(-1)).toMatchObject({ action: 'renamed', detail: { from: a.name, to: 'Fern frond, left side' } });
    const taken = await call(photographer, 'patch', sessionId, `/stacks/${b.id}`, { name: 'fern frond, LEFT side' });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/already called/);
    expect((await call(photographer, 'patch', sessionId, `/stacks/${b.id}`, { name: '   ' })).status).toBe(422);
    expect((await call(photographer, 'patch', sessionId, `/stacks/${b.id}`, { name: 'bad\u0007name' })).status).toBe(422);
    expect((await call(photographer, 'patch', sessionId, `/stacks/${b.id}`, { name: 'x'.repeat(121) })).status).toBe(422);
    expect((await call(photographer, 'patch', sessionId, `/stacks/${b.id}`, {})).status).toBe(422);
    expect((await undo(sessionId)).sorting.stacks[0].name).toBe(a.name);
  });

  it('links a plan of the same studio, refuses another studio’s plan, unlinks', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    const planBody = {
      name: 'Fern frond at 0.5×',
      inputs: { focalLengthMm: 50, extensionMm: 25, fNumber: 8, cocMm: 0.03, sensor: { widthMm: 23.5, heightMm: 15.6, pixelsAcross: 3872 }, depthMm: 4, overlap: 0.2, dofModel: 'geometric', railStepUm: 5, secondsPerFrame: 2, exposureTimeS: 0.5, stableSeconds: 300 },
      focusingMethod: 'rail',
    };
    const plan = await photographer.post(`/api/studios/${fx.studioId}/plans`).set('x-csrf-token', photographer.csrf).send(planBody);
    expect(plan.status, JSON.stringify(plan.body)).toBe(201);
    const other = await createStudioWithRoles('Plan Elsewhere');
    const otherAgent = await agentFor(app, other.users.photographer);
    const foreignPlan = await otherAgent.post(`/api/studios/${other.studioId}/plans`).set('x-csrf-token', otherAgent.csrf).send(planBody);
    expect(foreignPlan.status).toBe(201);

    const linked = await call(photographer, 'patch', sessionId, `/stacks/${a.id}`, { planId: plan.body.id });
    expect(linked.status).toBe(200);
    expect(linked.body.stacks[0].planId).toBe(plan.body.id);
    expect((await events(a.id)).at(-1)).toMatchObject({ action: 'plan-linked', detail: { planId: plan.body.id, planName: planBody.name } });
    const foreign = await call(photographer, 'patch', sessionId, `/stacks/${a.id}`, { planId: foreignPlan.body.id });
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.message).toMatch(/No such plan in this studio/);
    const unlinked = await call(photographer, 'patch', sessionId, `/stacks/${a.id}`, { planId: null });
    expect(unlinked.body.stacks[0].planId).toBeNull();
    expect((await undo(sessionId)).sorting.stacks[0].planId).toBe(plan.body.id);
  });

  it('reorders frames within a stack when every frame is named once', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    const reversed = a.frames.map((f) => f.id).reverse();
    const res = await call(photographer, 'post', sessionId, `/stacks/${a.id}/order`, { frameIds: reversed });
    expect(res.status).toBe(200);
    expect(res.body.stacks[0].frames.map((f: { id: string }) => f.id)).toEqual(reversed);
    expect(res.body.stacks[0].version).toBe(a.version + 1);
    const short = await call(photographer, 'post', sessionId, `/stacks/${a.id}/order`, { frameIds: reversed.slice(1) });
    expect(short.status).toBe(422);
    expect(short.body.error.message).toMatch(/exactly once: it has 6 frames/);
    expect((await call(photographer, 'post', sessionId, `/stacks/${a.id}/order`, { frameIds: [...reversed.slice(1), reversed[1]] })).status).toBe(422);
    expect((await undo(sessionId)).sorting.stacks[0].frames.map((f) => f.id)).toEqual(a.frames.map((f) => f.id));
  });

  it('marks a stack ready and back to draft, refusing states the hand-off owns', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    const ready = await call(photographer, 'post', sessionId, `/stacks/${a.id}/state`, { state: 'ready' });
    expect(ready.status).toBe(200);
    expect(ready.body.stacks[0]).toMatchObject({ state: 'ready', version: a.version + 1 });
    expect((await events(a.id)).at(-1)).toMatchObject({ action: 'marked-ready', detail: { from: 'draft' } });
    expect((await call(photographer, 'post', sessionId, `/stacks/${a.id}/state`, { state: 'handed-off' })).status).toBe(422);
    const draft = await call(photographer, 'post', sessionId, `/stacks/${a.id}/state`, { state: 'draft' });
    expect(draft.body.stacks[0].state).toBe('draft');
    expect((await events(a.id)).at(-1)?.action).toBe('back-to-draft');
    expect((await undo(sessionId)).sorting.stacks[0].state).toBe('ready');
  });
});

describe('locks, roles and automatic grouping', () => {
  it('answers 409 for every edit touching a stack past ready, and changes nothing', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b, c] = sorting.stacks;
    await setStateInDb(b.id, 'handed-off');
    const attempts = [
      call(photographer, 'post', sessionId, `/stacks/${b.id}/split`, { frameId: b.frames[2].id }),
      call(photographer, 'post', sessionId, `/stacks/${b.id}/merge-next`),
      call(photographer, 'post', sessionId, `/stacks/${a.id}/merge-next`), // the next one is locked
      call(photographer, 'post', sessionId, '/frames/move', { frameIds: [b.frames[0].id], toStackId: c.id }),
      call(photographer, 'post', sessionId, '/frames/move', { frameIds: [a.frames[0].id], toStackId: b.id }),
      call(photographer, 'post', sessionId, '/frames/exclusion', { frameIds: [b.frames[0].id], excluded: true }),
      call(photographer, 'patch', sessionId, `/stacks/${b.id}`, { name: 'Renamed' }),
      call(photographer, 'post', sessionId, `/stacks/${b.id}/order`, { frameIds: b.frames.map((f) => f.id).reverse() }),
      call(photographer, 'post', sessionId, `/stacks/${b.id}/state`, { state: 'draft' }),
    ];
    for (const res of await Promise.all(attempts)) {
      expect(res.status, JSON.stringify(res.body)).toBe(409);
      expect(res.body.error.message).toMatch(/is handed-off; only draft and ready stacks can be edited/);
    }
    const after = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200);
    expect(arrangement(after.body)).toEqual(arrangement({ ...sorting, stacks: sorting.stacks.map((s) => (s.id === b.id ? { ...s, state: 'handed-off' } : s)) }));
  });

  it('refuses guests and retouchers (403), other studios (403 on our URL, 404 through their own)', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    for (const role of ['guest', 'retoucher'] as const) {
      const agent = await agentFor(app, fx.users[role]);
      expect((await call(agent, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: a.frames[2].id })).status).toBe(403);
      expect((await call(agent, 'post', sessionId, '/frames/exclusion', { frameIds: [a.frames[0].id], excluded: true })).status).toBe(403);
      expect((await call(agent, 'patch', sessionId, `/stacks/${a.id}`, { name: 'Mine' })).status).toBe(403);
    }
    const other = await createStudioWithRoles('Stranger Studio');
    const stranger = await agentFor(app, other.users.owner);
    expect((await call(stranger, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: a.frames[2].id })).status).toBe(403);
    expect((await call(stranger, 'post', sessionId, `/stacks/${a.id}/split`, { frameId: a.frames[2].id }, other.studioId)).status).toBe(404);
    expect((await call(stranger, 'post', sessionId, '/frames/move', { frameIds: [a.frames[0].id], toStackId: null }, other.studioId)).status).toBe(404);
    const after = await photographer.get(`${sessionsBase(fx.studioId)}/${sessionId}/sorting`).expect(200);
    expect(arrangement(after.body)).toEqual(arrangement(sorting));
  });

  it('keeps stacks marked ready when the automatic grouping runs again', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a, b] = sorting.stacks;
    await call(photographer, 'patch', sessionId, `/stacks/${b.id}`, { name: 'Checked by hand' }).expect(200);
    await call(photographer, 'post', sessionId, `/stacks/${b.id}/state`, { state: 'ready' }).expect(200);
    // Stacks must now have 20 frames: every draft stack dissolves into loose frames, the ready one stays.
    const res = await call(photographer, 'post', sessionId, '/regroup', { minStackSize: 20 });
    expect(res.status).toBe(200);
    expect(res.body.stacks).toHaveLength(1);
    expect(res.body.stacks[0]).toMatchObject({ id: b.id, name: 'Checked by hand', state: 'ready' });
    expect(res.body.stacks[0].frames.map((f: { id: string }) => f.id)).toEqual(b.frames.map((f) => f.id));
    expect(res.body.loose).toHaveLength(card.length - b.frames.length);
    // Back to the usual rule: the draft stacks return (new ids), the ready one is untouched.
    const again = await call(photographer, 'post', sessionId, '/regroup', { minStackSize: 3 });
    expect(again.body.stacks.map((s: StackV) => s.frames.length)).toEqual([6, 5, 4]);
    expect(again.body.stacks[1]).toMatchObject({ id: b.id, state: 'ready', name: 'Checked by hand' });
    expect(again.body.stacks[0].id).not.toBe(a.id);
    const eventsB = await events(b.id);
    expect(eventsB.map((e) => e.action)).toEqual(['renamed', 'marked-ready']);
  });

  it('lists a stack’s audit trail for members who may read the session', async () => {
    const { sessionId, sorting } = await freshSession();
    const [a] = sorting.stacks;
    await call(photographer, 'post', sessionId, `/stacks/${a.id}/state`, { state: 'ready' }).expect(200);
    const guest = await agentFor(app, fx.users.guest);
    const res = await guest.get(`${sessionsBase(fx.studioId)}/${sessionId}/stacks/${a.id}/events`).expect(200);
    expect(res.body.events[0]).toMatchObject({ action: 'marked-ready', actor: 'Test photographer' });
    expect((await guest.get(`${sessionsBase(fx.studioId)}/${sessionId}/stacks/${crypto.randomUUID()}/events`)).status).toBe(404);
  });
});

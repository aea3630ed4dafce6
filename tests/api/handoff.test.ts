import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import sharp from 'sharp';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, TEST_PASSWORD, type StudioFixture } from '../helpers/fixtures';
import { sessionsBase } from '../helpers/sessions';
import { startTestWorkers, until } from '../helpers/worker';
import { binaryParser, checkZip, identifySize, mailTo, readyStack } from '../helpers/handoff';

let app: Express;
let fx: StudioFixture;
let owner: Agent;
let photographer: Agent;
let retoucher: Agent;
let otherRetoucher: Agent;
let otherRetoucherId: string;
let guest: Agent;
let workers: { stop: () => Promise<void> };

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Hand-off Studio');
  owner = await agentFor(app, fx.users.owner);
  photographer = await agentFor(app, fx.users.photographer);
  retoucher = await agentFor(app, fx.users.retoucher);
  guest = await agentFor(app, fx.users.guest);
  const { getDataSource } = await import('../../server/lib/data-source');
  const { hashPassword } = await import('../../server/lib/passwords');
  const { addMember } = await import('../../server/services/membership-service');
  const { User } = await import('../../server/entities/user');
  const email = `second-retoucher-${crypto.randomBytes(4).toString('hex')}@studio.test`;
  const repo = getDataSource().getRepository(User);
  const second = await repo.save(repo.create({ email, name: 'Second retoucher', passwordHash: await hashPassword(TEST_PASSWORD) }));
  await addMember(fx.studioId, second.id, 'retoucher');
  otherRetoucherId = second.id;
  otherRetoucher = await agentFor(app, { email, password: TEST_PASSWORD });
  workers = await startTestWorkers();
});
afterAll(async () => {
  await workers?.stop();
  const { closeQueues } = await import('../../server/lib/queues');
  await closeQueues();
});

const base = () => `/api/studios/${fx.studioId}/stacks`;
const post = (agent: Agent, url: string, body: object = {}) => agent.post(url).set('x-csrf-token', agent.csrf).send(body);
const handOff = (agent: Agent, stackId: string, body: object) => post(agent, `${base()}/${stackId}/handoff`, body);
const step = (agent: Agent, stackId: string, name: 'take-back' | 'archive') => post(agent, `${base()}/${stackId}/handoff/${name}`);
const uploadMerged = (agent: Agent, stackId: string, data: Buffer, name = 'merged.jpg') =>
  agent.post(`${base()}/${stackId}/handoff/merged`).set('x-csrf-token', agent.csrf).attach('file', data, { filename: name, contentType: 'application/octet-stream' });
const view = async (agent: Agent, stackId: string) => (await agent.get(`${base()}/${stackId}/handoff`).expect(200)).body;
const toRetoucher = { to: 'member', retoucherUserId: '' };

async function mergedJpeg(widthPx = 300, heightPx = 200) {
  return sharp({ create: { width: widthPx, height: heightPx, channels: 3, background: { r: 90, g: 130, b: 70 } } }).jpeg({ quality: 80 }).toBuffer();
}

describe('hand-off states', () => {
  it('moves a stack only along draft → ready → handed-off → merged → archived, refusing every other step with a reason', async () => {
    toRetoucher.retoucherUserId = fx.users.retoucher.id;
    const { sessionId, stackId } = await readyStack(photographer, fx.studioId, 'STM');
    // Back to draft: nothing past ready is allowed from there.
    await post(photographer, `${sessionsBase(fx.studioId)}/${sessionId}/stacks/${stackId}/state`, { state: 'draft' }).expect(200);
    const fromDraft = await handOff(photographer, stackId, toRetoucher);
    expect(fromDraft.status).toBe(409);
    expect(fromDraft.body.error.message).toMatch(/still a draft; only ready stacks can be handed off/);
    expect((await step(photographer, stackId, 'take-back')).body.error.message).toMatch(/only a handed-off stack can be taken back/);
    expect((await step(photographer, stackId, 'archive')).body.error.message).toMatch(/only merged stacks can be archived/);
    const early = await uploadMerged(photographer, stackId, await mergedJpeg());
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/only be added while the stack is handed off/);

    await post(photographer, `${sessionsBase(fx.studioId)}/${sessionId}/stacks/${stackId}/state`, { state: 'ready' }).expect(200);
    const handed = await handOff(photographer, stackId, toRetoucher);
    expect(handed.status, JSON.stringify(handed.body)).toBe(201);
    expect(handed.body.handoff.stack).toMatchObject({ state: 'handed-off', handedTo: { kind: 'member', userId: fx.users.retoucher.id } });
    expect(handed.body.shareLink).toBeNull();
    expect((await handOff(owner, stackId, toRetoucher)).body.error.message).toMatch(/already handed off/);
    expect((await step(owner, stackId, 'archive')).status).toBe(409);
    // Hand edits stop at the hand-off: the frames stay as they were handed on.
    const rename = await photographer.patch(`${sessionsBase(fx.studioId)}/${sessionId}/stacks/${stackId}`).set('x-csrf-token', photographer.csrf).send({ name: 'Renamed' });
    expect(rename.status).toBe(409);

    const back = await step(owner, stackId, 'take-back');
    expect(back.status).toBe(200);
    expect(back.body.stack).toMatchObject({ state: 'ready', handedTo: null });
    expect((await step(owner, stackId, 'take-back')).status).toBe(409);

    await handOff(photographer, stackId, toRetoucher).expect(201);
    await uploadMerged(retoucher, stackId, await mergedJpeg()).expect(201);
    expect((await step(photographer, stackId, 'take-back')).body.error.message).toMatch(/merged: its merged result is in/);
    const again = await uploadMerged(retoucher, stackId, await mergedJpeg());
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already has its merged result/);
    const archived = await step(photographer, stackId, 'archive');
    expect(archived.status).toBe(200);
    expect(archived.body.stack.state).toBe('archived');
    expect((await step(photographer, stackId, 'archive')).status).toBe(409);
    expect((await handOff(photographer, stackId, toRetoucher)).body.error.message).toMatch(/archived; only ready stacks/);

    const events = (await view(owner, stackId)).events.map((e: { action: string }) => e.action);
    expect(events.slice(0, 5)).toEqual(['archived', 'merged-uploaded', 'handed-off', 'taken-back', 'handed-off']);
  });

  it('hands off only to a retoucher of the studio, with readable field errors', async () => {
    const { stackId } = await readyStack(photographer, fx.studioId, 'WHO');
    const toGuest = await handOff(photographer, stackId, { to: 'member', retoucherUserId: fx.users.guest.id });
    expect(toGuest.status).toBe(422);
    expect(toGuest.body.error.details[0]).toMatchObject({ path: 'retoucherUserId', message: expect.stringMatching(/guest here, not a retoucher/) });
    const stranger = await handOff(photographer, stackId, { to: 'member', retoucherUserId: crypto.randomUUID() });
    expect(stranger.body.error.details[0]).toMatchObject({ path: 'retoucherUserId', message: expect.stringMatching(/not a member of this studio/) });
    const tooLong = await handOff(photographer, stackId, { to: 'email', email: 'outside@retouch.test', expiryDays: 31 });
    expect(tooLong.status).toBe(422);
    expect(tooLong.body.error.details[0]).toMatchObject({ path: 'expiryDays', message: 'A share link lives at most 30 days.' });
    const badMail = await handOff(photographer, stackId, { to: 'email', email: 'not-an-address' });
    expect(badMail.body.error.details[0].path).toBe('email');
    // A retoucher or guest cannot hand anything off.
    expect((await handOff(retoucher, stackId, toRetoucher)).status).toBe(403);
    expect((await handOff(guest, stackId, toRetoucher)).status).toBe(403);
    expect((await view(owner, stackId)).stack.state).toBe('ready');
  });
});

describe('the retoucher member', () => {
  it('sees only the stacks handed to them, downloads the bundle, uploads the merged result, and the photographer hears of each step', async () => {
    const { stackId, frameNames } = await readyStack(photographer, fx.studioId, 'RTC');
    expect((await retoucher.get(`${base()}/${stackId}/handoff`)).status).toBe(403);
    expect((await retoucher.get(`${base()}/${stackId}/handoff/bundle`)).status).toBe(403);
    await handOff(photographer, stackId, { to: 'member', retoucherUserId: fx.users.retoucher.id }).expect(201);

    expect((await otherRetoucher.get(`${base()}/${stackId}/handoff`)).status).toBe(403);
    const mine = (await retoucher.get(`/api/studios/${fx.studioId}/handoffs/mine`).expect(200)).body.handoffs;
    expect(mine.map((h: { stackId: string }) => h.stackId)).toContain(stackId);
    const theirs = (await otherRetoucher.get(`/api/studios/${fx.studioId}/handoffs/mine`).expect(200)).body.handoffs;
    expect(theirs.map((h: { stackId: string }) => h.stackId)).not.toContain(stackId);
    const panel = await view(retoucher, stackId);
    expect(panel.can).toMatchObject({ handOff: false, takeBack: false, uploadMerged: true });
    expect(panel.retouchers).toEqual([]);

    const about = `/stacks/${stackId}`;
    expect((await mailTo(fx.users.photographer.email, 'Handed off: ', about)).subject).toContain('Test retoucher');
    expect((await mailTo(fx.users.retoucher.email, 'A stack to merge from ', `/handoffs?stack=${stackId}`)).text).toContain('Test photographer handed you');

    // The bundle was asked for at hand-off; until it is made the answer is 409 with a reason.
    const zip = await until('bundle', async () => {
      const res = await retoucher.get(`${base()}/${stackId}/handoff/bundle`).buffer(true).parse(binaryParser);
      if (res.status === 409) expect(res.body.toString()).toMatch(/being prepared, try again in a minute/);
      return res.status === 200 && (res.body as Buffer);
    });
    // Debian's unzip is the reference for the archive; the manifest keeps the stack order.
    const { testOutput, manifest } = checkZip(zip);
    expect(testOutput).toMatch(/No errors detected/);
    expect(manifest.frames.map((f) => f.files[0].originalName)).toEqual(frameNames);
    expect(manifest.frames.map((f) => f.number)).toEqual(frameNames.map((_, i) => i + 1));
    expect((await mailTo(fx.users.photographer.email, 'Downloaded: ', about)).text).toContain('Test retoucher downloaded the bundle');

    const sheet = await retoucher.get(`/api/studios/${fx.studioId}/stacks/${stackId}/contact-sheet.jpg`).buffer(true).parse(binaryParser);
    expect(sheet.status).toBe(200);
    expect((await sharp(sheet.body as Buffer).metadata()).format).toBe('jpeg');

    // Wrong people and wrong files are refused; nothing changes.
    const merged = await mergedJpeg(420, 280);
    expect((await uploadMerged(otherRetoucher, stackId, merged)).status).toBe(403);
    expect((await uploadMerged(guest, stackId, merged)).status).toBe(403);
    const text = await uploadMerged(retoucher, stackId, Buffer.from('the merged picture is on its way\n'), 'merged.jpg');
    expect(text.status).toBe(422);
    expect(text.body.error.details[0]).toMatchObject({ path: 'file', message: expect.stringMatching(/looks like text.*JPEG or TIFF/) });
    const png = await sharp({ create: { width: 20, height: 20, channels: 3, background: '#888' } }).png().toBuffer();
    expect((await uploadMerged(retoucher, stackId, png, 'merged.jpg')).body.error.details[0].message).toMatch(/a PNG picture\. Send the merged picture as a JPEG or TIFF/);
    expect((await view(photographer, stackId)).stack.state).toBe('handed-off');

    const ok = await uploadMerged(retoucher, stackId, merged, 'fern-merged.jpg');
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.handoff.stack.state).toBe('merged');
    expect(ok.body.mergedResult).toMatchObject({ originalName: 'fern-merged.jpg', sizeBytes: merged.length, mime: 'image/jpeg' });
    expect((await mailTo(fx.users.photographer.email, 'Merged result in: ', about)).text).toContain('fern-merged.jpg');

    // The worker makes its previews; ImageMagick reads the same size from the stored file.
    const done = await until('merged preview', async () => {
      const v = await view(photographer, stackId);
      return v.mergedResult.previewStatus === 'done' && v.mergedResult;
    });
    expect({ widthPx: done.widthPx, heightPx: done.heightPx }).toEqual(identifySize(merged));
    const file = await photographer.get(`${base()}/${stackId}/handoff/merged/file`).buffer(true).parse(binaryParser).expect(200);
    expect(crypto.createHash('sha256').update(file.body as Buffer).digest('hex')).toBe(crypto.createHash('sha256').update(merged).digest('hex'));
    const small = await guest.get(`${base()}/${stackId}/handoff/merged/preview/small`).buffer(true).parse(binaryParser).expect(200);
    const smallMeta = await sharp(small.body as Buffer).metadata();
    expect(Math.max(smallMeta.width ?? 0, smallMeta.height ?? 0)).toBeLessThanOrEqual(320);

    const trail = (await view(photographer, stackId)).events as { action: string; actor: string; at: string }[];
    expect(trail.slice(0, 3).map((e) => [e.action, e.actor])).toEqual([
      ['merged-uploaded', 'Test retoucher'], ['bundle-downloaded', 'Test retoucher'], ['handed-off', 'Test photographer'],
    ]);
    for (const e of trail) expect(Number.isNaN(Date.parse(e.at))).toBe(false);
  });

  it('takes a merged TIFF, and refuses a camera raw file as a merged result', async () => {
    const { stackId } = await readyStack(photographer, fx.studioId, 'TIF');
    await handOff(owner, stackId, { to: 'member', retoucherUserId: otherRetoucherId }).expect(201);
    const raw = Buffer.concat([Buffer.from([0x49, 0x49, 0x52, 0x4f]), Buffer.alloc(5000)]);
    const refused = await uploadMerged(otherRetoucher, stackId, raw, 'merged.tif');
    expect(refused.body.error.details[0].message).toMatch(/camera raw file, not a merged picture/);
    const tiff = await sharp({ create: { width: 240, height: 160, channels: 3, background: '#5a7' } }).tiff().toBuffer();
    const ok = await uploadMerged(otherRetoucher, stackId, tiff, 'beetle.tif');
    expect(ok.status, JSON.stringify(ok.body)).toBe(201);
    expect(ok.body.mergedResult.mime).toBe('image/tiff');
  });
});

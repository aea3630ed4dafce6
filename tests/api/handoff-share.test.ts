// Hand-off to an outside retoucher through a share link: what the link opens, what it refuses.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import sharp from 'sharp';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { startTestWorkers, until } from '../helpers/worker';
import { binaryParser, checkZip, mailTo, readyStack } from '../helpers/handoff';

let app: Express;
let fx: StudioFixture;
let photographer: Agent;
let outsider: Agent;
let workers: { stop: () => Promise<void> };

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Share Studio');
  photographer = await agentFor(app, fx.users.photographer);
  outsider = await agentFor(app);
  workers = await startTestWorkers();
});
afterAll(async () => {
  await workers?.stop();
  const { closeQueues } = await import('../../server/lib/queues');
  await closeQueues();
});

const stacksBase = (studioId = fx.studioId) => `/api/studios/${studioId}/stacks`;
const outsideEmail = () => `outside-${crypto.randomBytes(3).toString('hex')}@retouch.test`;

async function handOffByMail(email: string, expiryDays?: number) {
  const { stackId, frameNames } = await readyStack(photographer, fx.studioId, 'SHR');
  const res = await photographer.post(`${stacksBase()}/${stackId}/handoff`).set('x-csrf-token', photographer.csrf).send({ to: 'email', email, expiryDays });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const url: string = res.body.shareLink.url;
  return { stackId, frameNames, token: url.slice(url.lastIndexOf('/') + 1), shareLink: res.body.shareLink };
}

async function db() {
  const { getDataSource } = await import('../../server/lib/data-source');
  return getDataSource();
}

describe('share links', () => {
  it('opens the stack for the outside retoucher: page, contact sheet, bundle (counted) and the merged upload', async () => {
    const email = outsideEmail();
    const before = Date.now();
    const { stackId, frameNames, token, shareLink } = await handOffByMail(email, 3);
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes = 256 bits, base64url
    // The expiry asked for: 3 days from now, within the test's own run.
    const expiresAt = Date.parse(shareLink.expiresAt);
    expect(expiresAt).toBeGreaterThanOrEqual(before + 3 * 86_400_000);
    expect(expiresAt).toBeLessThanOrEqual(Date.now() + 3 * 86_400_000);
    // Only the token's SHA-256 is stored.
    const rows: { token_hash: string }[] = await (await db()).query(`SELECT token_hash FROM share_links WHERE stack_id = $1`, [stackId]);
    expect(rows).toEqual([{ token_hash: crypto.createHash('sha256').update(token).digest('hex') }]);
    expect((await mailTo(email, 'Frames to merge from ', token)).text).toContain('valid until');

    const page = await outsider.get(`/api/share/${token}`).expect(200);
    expect(page.body).toMatchObject({ stackName: 'Stack 01', studioName: expect.stringContaining('Share Studio'), email, state: 'handed-off', downloadCount: 0, canUploadMerged: true });
    expect(page.body.expiresAt).toBe(shareLink.expiresAt);

    // With no bundle of this version at all, the link asks for one and says so.
    await (await db()).query(`DELETE FROM bundles WHERE stack_id = $1`, [stackId]);
    const first = await outsider.get(`/api/share/${token}/bundle`);
    expect(first.status).toBe(409);
    expect(first.body.error.message).toBe('The bundle is being prepared, try again in a minute.');
    expect((await outsider.get(`/api/share/${token}`)).body.bundle.status).not.toBe('none');
    // The share page asks for it without downloading: POST answers 202 while it is being made.
    await (await db()).query(`DELETE FROM bundles WHERE stack_id = $1`, [stackId]);
    const asked = await outsider.post(`/api/share/${token}/bundle`).set('x-csrf-token', outsider.csrf).send({});
    expect(asked.status).toBe(202);
    expect(asked.body).toEqual({ status: 'preparing', sizeBytes: null });
    const zip = await until('bundle through the link', async () => {
      const res = await outsider.get(`/api/share/${token}/bundle`).buffer(true).parse(binaryParser);
      if (res.status !== 200) expect(res.status).toBe(409);
      return res.status === 200 && (res.body as Buffer);
    });
    // Debian's unzip checks the archive; the manifest keeps the stack's order.
    const { testOutput, manifest } = checkZip(zip);
    expect(testOutput).toMatch(/No errors detected/);
    expect(manifest.frames.map((f) => f.files[0].originalName)).toEqual(frameNames);
    expect((await outsider.get(`/api/share/${token}`)).body.downloadCount).toBe(1);
    await outsider.get(`/api/share/${token}/bundle`).buffer(true).parse(binaryParser).expect(200);
    expect((await outsider.get(`/api/share/${token}`)).body.downloadCount).toBe(2);
    const links = (await photographer.get(`${stacksBase()}/${stackId}/handoff`).expect(200)).body.shareLinks;
    expect(links).toMatchObject([{ email, downloadCount: 2, status: 'active' }]);
    expect((await mailTo(fx.users.photographer.email, 'Downloaded: ', `/stacks/${stackId}`)).subject).toContain(email);

    const sheet = await outsider.get(`/api/share/${token}/contact-sheet.jpg`).buffer(true).parse(binaryParser).expect(200);
    expect((await sharp(sheet.body as Buffer).metadata()).format).toBe('jpeg');

    // No CSRF token: refused like any other form.
    const merged = await sharp({ create: { width: 200, height: 150, channels: 3, background: '#4a6' } }).jpeg().toBuffer();
    expect((await outsider.post(`/api/share/${token}/merged`).attach('file', merged, 'dew.jpg')).status).toBe(403);
    const bad = await outsider.post(`/api/share/${token}/merged`).set('x-csrf-token', outsider.csrf).attach('file', Buffer.from('#!/bin/sh\necho hi\n'), 'dew.jpg');
    expect(bad.status).toBe(422);
    expect(bad.body.error.details[0].message).toMatch(/executable.*JPEG or TIFF/);
    const up = await outsider.post(`/api/share/${token}/merged`).set('x-csrf-token', outsider.csrf).attach('file', merged, 'dew.jpg');
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.body.share).toMatchObject({ state: 'merged', canUploadMerged: false, mergedResult: { originalName: 'dew.jpg', sizeBytes: merged.length } });
    const panel = (await photographer.get(`${stacksBase()}/${stackId}/handoff`).expect(200)).body;
    expect(panel.stack.state).toBe('merged');
    expect(panel.events[0]).toMatchObject({ action: 'merged-uploaded', actor: `${email} (share link)` });
    expect((await mailTo(fx.users.photographer.email, 'Merged result in: ', `/stacks/${stackId}`)).text).toContain(`${email} (share link) sent back`);
  });

  it('refuses guessed, revoked, expired, taken-back and other-studio links', async () => {
    const guessed = crypto.randomBytes(32).toString('base64url');
    for (const path of ['', '/contact-sheet.jpg', '/bundle']) {
      const res = await outsider.get(`/api/share/${guessed}${path}`);
      expect(res.status, path).toBe(404);
    }
    expect((await outsider.get('/api/share/short')).status).toBe(404);
    expect((await outsider.post(`/api/share/${guessed}/merged`).set('x-csrf-token', outsider.csrf).attach('file', Buffer.from([0xff, 0xd8, 0xff]), 'x.jpg')).status).toBe(404);

    const email = outsideEmail();
    const first = await handOffByMail(email);
    const second = await photographer.post(`${stacksBase()}/${first.stackId}/handoff/share-links`).set('x-csrf-token', photographer.csrf).send({ expiryDays: 30 });
    expect(second.status).toBe(201);
    const secondToken = second.body.shareLink.url.split('/').pop();
    const revoke = await photographer.delete(`${stacksBase()}/${first.stackId}/handoff/share-links/${second.body.shareLink.id}`).set('x-csrf-token', photographer.csrf);
    expect(revoke.status).toBe(200);
    expect(revoke.body.shareLinks.find((l: { id: string }) => l.id === second.body.shareLink.id).status).toBe('revoked');
    const revoked = await outsider.get(`/api/share/${secondToken}`);
    expect(revoked.status).toBe(410);
    expect(revoked.body.error.message).toMatch(/withdrew this share link/);
    expect((await outsider.get(`/api/share/${secondToken}/bundle`)).status).toBe(410);

    await (await db()).query(`UPDATE share_links SET expires_at = now() - interval '1 minute' WHERE token_hash = $1`, [crypto.createHash('sha256').update(first.token).digest('hex')]);
    const expired = await outsider.get(`/api/share/${first.token}`);
    expect(expired.status).toBe(410);
    expect(expired.body.error.message).toMatch(/expired on \d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/);
    expect((await outsider.post(`/api/share/${first.token}/merged`).set('x-csrf-token', outsider.csrf).attach('file', Buffer.from([0xff, 0xd8, 0xff]), 'x.jpg')).status).toBe(410);

    // Taking the hand-off back revokes every live link.
    const other = await handOffByMail(outsideEmail());
    await outsider.get(`/api/share/${other.token}`).expect(200);
    await photographer.post(`${stacksBase()}/${other.stackId}/handoff/take-back`).set('x-csrf-token', photographer.csrf).send({}).expect(200);
    expect((await outsider.get(`/api/share/${other.token}`)).status).toBe(410);

    // Another studio can neither see nor revoke this studio's links, and a link whose stack is not
    // in its own studio opens nothing.
    const elsewhere = await createStudioWithRoles('Elsewhere');
    const elsewhereOwner = await agentFor(app, elsewhere.users.owner);
    const live = await handOffByMail(outsideEmail());
    const link = (await photographer.get(`${stacksBase()}/${live.stackId}/handoff`).expect(200)).body.shareLinks[0];
    expect((await elsewhereOwner.delete(`${stacksBase(elsewhere.studioId)}/${live.stackId}/handoff/share-links/${link.id}`).set('x-csrf-token', elsewhereOwner.csrf)).status).toBe(404);
    expect((await elsewhereOwner.get(`${stacksBase(elsewhere.studioId)}/${live.stackId}/handoff`)).status).toBe(404);
    await outsider.get(`/api/share/${live.token}`).expect(200);
    await (await db()).query(`UPDATE share_links SET studio_id = $1 WHERE id = $2`, [elsewhere.studioId, link.id]);
    expect((await outsider.get(`/api/share/${live.token}`)).status).toBe(404);
  });

  it('makes extra links only for a stack handed off by e-mail', async () => {
    const { stackId } = await readyStack(photographer, fx.studioId, 'MBR');
    await photographer.post(`${stacksBase()}/${stackId}/handoff`).set('x-csrf-token', photographer.csrf).send({ to: 'member', retoucherUserId: fx.users.retoucher.id }).expect(201);
    const res = await photographer.post(`${stacksBase()}/${stackId}/handoff/share-links`).set('x-csrf-token', photographer.csrf).send({ expiryDays: 7 });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/handed to a studio member, who needs no share link/);
    const tooLong = await photographer.post(`${stacksBase()}/${stackId}/handoff/share-links`).set('x-csrf-token', photographer.csrf).send({ expiryDays: 0 });
    expect(tooLong.body.error.details[0]).toMatchObject({ path: 'expiryDays', message: 'A share link lives at least 1 day.' });
  });
});

import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { agentFor, buildApp } from '../helpers/api';
import { caughtMailTo, createStudioWithRoles, linkTokenFrom, type StudioFixture } from '../helpers/fixtures';

let app: Express;
let fx: StudioFixture;

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles();
});

beforeEach(async () => {
  const { getRedis } = await import('../../server/lib/redis');
  await getRedis().flushdb();
});

describe('sign-in', () => {
  it('signs in with the right password and reports the studio role', async () => {
    const agent = await agentFor(app, fx.users.photographer);
    const me = await agent.get('/api/auth/me').expect(200);
    expect(me.body.studios).toEqual([expect.objectContaining({ id: fx.studioId, role: 'photographer' })]);
    expect(me.body.activeStudioId).toBe(fx.studioId);
  });

  it('gives the same answer for an unknown e-mail and a wrong password', async () => {
    const a = await agentFor(app);
    const wrong = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send({ email: fx.users.owner.email, password: 'not-the-password' });
    const unknown = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send({ email: 'nobody@studio.test', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(unknown.body.error).toEqual(wrong.body.error);
  });

  it('issues a new session id at sign-in (no session fixation)', async () => {
    const agent = request.agent(app);
    const pre = await agent.get('/api/auth/csrf').expect(200);
    const before = /lamella\.sid=([^;]+)/.exec(String(pre.headers['set-cookie']))?.[1];
    expect(before).toBeTruthy();
    const res = await agent.post('/api/auth/sign-in').set('x-csrf-token', pre.body.csrfToken).send(fx.users.guest).expect(200);
    const after = /lamella\.sid=([^;]+)/.exec(String(res.headers['set-cookie']))?.[1];
    expect(after).toBeTruthy();
    expect(after).not.toBe(before);
    // The planted (old) id no longer carries a signed-in session.
    await request(app).get('/api/auth/me').set('Cookie', `lamella.sid=${before}`).expect(401);
  });

  it('sets an httpOnly, SameSite=Lax cookie', async () => {
    const res = await request(app).get('/api/auth/csrf');
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('limits failed attempts per account, even when the right password comes later', async () => {
    const a = await agentFor(app);
    for (let i = 0; i < 5; i++) {
      await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send({ email: fx.users.retoucher.email, password: `wrong-${i}` }).expect(401);
    }
    const blocked = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send(fx.users.retoucher);
    expect(blocked.status).toBe(429);
    expect(blocked.headers['retry-after']).toBeDefined();
  });

  it('limits failed attempts per address across accounts', async () => {
    const { resetEnvCache } = await import('../../server/lib/env');
    const { resetAuthLimiters } = await import('../../server/services/auth-service');
    process.env.SIGN_IN_LIMIT_PER_ADDRESS = '3';
    resetEnvCache();
    resetAuthLimiters();
    try {
      const a = await agentFor(app);
      for (let i = 0; i < 3; i++) {
        await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send({ email: `spray-${i}@studio.test`, password: 'guess-guess' }).expect(401);
      }
      const res = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send(fx.users.owner);
      expect(res.status).toBe(429);
    } finally {
      delete process.env.SIGN_IN_LIMIT_PER_ADDRESS;
      resetEnvCache();
      resetAuthLimiters();
    }
  });
});

describe('CSRF', () => {
  it('refuses a state-changing request without the token, and with a wrong one', async () => {
    const agent = await agentFor(app, fx.users.owner);
    const none = await agent.post(`/api/studios/${fx.studioId}/invitations`).send({ email: 'x@studio.test', role: 'guest' });
    expect(none.status).toBe(403);
    expect(none.body.error.code).toBe('csrf');
    const wrong = await agent.post(`/api/studios/${fx.studioId}/invitations`).set('x-csrf-token', 'forged').send({ email: 'x@studio.test', role: 'guest' });
    expect(wrong.status).toBe(403);
    const signInNoToken = await request(app).post('/api/auth/sign-in').send(fx.users.owner);
    expect(signInNoToken.status).toBe(403);
  });
});

describe('invitations', () => {
  it('invites by e-mail; the link works once and makes a member with that role', async () => {
    const owner = await agentFor(app, fx.users.owner);
    const email = `new-assistant-${Date.now()}@studio.test`;
    await owner.post(`/api/studios/${fx.studioId}/invitations`).set('x-csrf-token', owner.csrf).send({ email, role: 'photographer' }).expect(201);
    const [mail] = await caughtMailTo(email);
    expect(mail.subject).toMatch(/invited/);
    const token = linkTokenFrom(mail.text, 'invite');

    const visitor = await agentFor(app);
    const info = await visitor.get(`/api/auth/invitations/${token}`).expect(200);
    expect(info.body).toMatchObject({ email, role: 'photographer', hasAccount: false });
    const accepted = await visitor.post(`/api/auth/invitations/${token}/accept`).set('x-csrf-token', visitor.csrf).send({ name: 'New Assistant', password: 'a-long-enough-password' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.me.studios).toEqual([expect.objectContaining({ id: fx.studioId, role: 'photographer' })]);

    const again = await agentFor(app);
    const reuse = await again.post(`/api/auth/invitations/${token}/accept`).set('x-csrf-token', again.csrf).send({ password: 'a-long-enough-password' });
    expect(reuse.status).toBe(410);
  });

  it('refuses an expired, a revoked and a made-up invitation', async () => {
    const owner = await agentFor(app, fx.users.owner);
    const { getDataSource } = await import('../../server/lib/data-source');
    const emailA = `late-${Date.now()}@studio.test`;
    const emailB = `revoked-${Date.now()}@studio.test`;
    await owner.post(`/api/studios/${fx.studioId}/invitations`).set('x-csrf-token', owner.csrf).send({ email: emailA, role: 'guest' }).expect(201);
    const b = await owner.post(`/api/studios/${fx.studioId}/invitations`).set('x-csrf-token', owner.csrf).send({ email: emailB, role: 'guest' }).expect(201);
    await getDataSource().query(`UPDATE invitations SET expires_at = now() - interval '1 minute' WHERE email = $1`, [emailA]);
    await owner.delete(`/api/studios/${fx.studioId}/invitations/${b.body.id}`).set('x-csrf-token', owner.csrf).expect(204);
    const tokenA = linkTokenFrom((await caughtMailTo(emailA))[0].text, 'invite');
    const tokenB = linkTokenFrom((await caughtMailTo(emailB))[0].text, 'invite');
    const v = await agentFor(app);
    expect((await v.get(`/api/auth/invitations/${tokenA}`)).status).toBe(410);
    expect((await v.get(`/api/auth/invitations/${tokenB}`)).status).toBe(410);
    expect((await v.get(`/api/auth/invitations/not-a-real-token-at-all`)).status).toBe(404);
    const accept = await v.post(`/api/auth/invitations/${tokenA}/accept`).set('x-csrf-token', v.csrf).send({ password: 'a-long-enough-password' });
    expect(accept.status).toBe(410);
  });
});

describe('password reset', () => {
  it('resets by e-mail link once; the old password stops working; unknown e-mails look the same', async () => {
    const fx2 = await createStudioWithRoles('Reset Studio');
    const a = await agentFor(app);
    const known = await a.post('/api/auth/password-reset').set('x-csrf-token', a.csrf).send({ email: fx2.users.guest.email });
    const unknown = await a.post('/api/auth/password-reset').set('x-csrf-token', a.csrf).send({ email: 'ghost@studio.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    const token = linkTokenFrom((await caughtMailTo(fx2.users.guest.email))[0].text, 'reset');
    await a.post(`/api/auth/password-reset/${token}`).set('x-csrf-token', a.csrf).send({ password: 'brand-new-password-1' }).expect(204);
    const reuse = await a.post(`/api/auth/password-reset/${token}`).set('x-csrf-token', a.csrf).send({ password: 'another-password-2' });
    expect(reuse.status).toBe(410);
    const old = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send(fx2.users.guest);
    expect(old.status).toBe(401);
    await agentFor(app, { email: fx2.users.guest.email, password: 'brand-new-password-1' });
  });

  it('rejects a short new password with a field error', async () => {
    const a = await agentFor(app);
    const res = await a.post('/api/auth/password-reset/whatever').set('x-csrf-token', a.csrf).send({ password: 'short' });
    expect(res.status).toBe(422);
    expect(res.body.error.details[0].path).toBe('password');
  });
});

describe('members and roles', () => {
  it('changes roles, and never removes or demotes the last owner', async () => {
    const fx3 = await createStudioWithRoles('Roles Studio');
    const owner = await agentFor(app, fx3.users.owner);
    const { body } = await owner.get(`/api/studios/${fx3.studioId}/members`).expect(200);
    const ownerRow = body.members.find((m: { role: string }) => m.role === 'owner');
    const guestRow = body.members.find((m: { role: string }) => m.role === 'guest');
    const demote = await owner.patch(`/api/studios/${fx3.studioId}/members/${ownerRow.id}`).set('x-csrf-token', owner.csrf).send({ role: 'guest' });
    expect(demote.status).toBe(409);
    const remove = await owner.delete(`/api/studios/${fx3.studioId}/members/${ownerRow.id}`).set('x-csrf-token', owner.csrf);
    expect(remove.status).toBe(409);
    await owner.patch(`/api/studios/${fx3.studioId}/members/${guestRow.id}`).set('x-csrf-token', owner.csrf).send({ role: 'owner' }).expect(200);
    await owner.patch(`/api/studios/${fx3.studioId}/members/${ownerRow.id}`).set('x-csrf-token', owner.csrf).send({ role: 'photographer' }).expect(200);
    const bad = await owner.patch(`/api/studios/${fx3.studioId}/members/${guestRow.id}`).set('x-csrf-token', owner.csrf).send({ role: 'emperor' });
    expect(bad.status).toBe(403); // no longer owner
  });

  it('switches between studios the user belongs to, and not to others', async () => {
    const other = await createStudioWithRoles('Other Studio');
    const agent = await agentFor(app, fx.users.owner);
    const created = await agent.post('/api/auth/studios').set('x-csrf-token', agent.csrf).send({ name: 'Second bench' }).expect(201);
    expect(created.body.studios).toHaveLength(2);
    const back = await agent.post('/api/auth/active-studio').set('x-csrf-token', agent.csrf).send({ studioId: fx.studioId }).expect(200);
    expect(back.body.activeStudioId).toBe(fx.studioId);
    const foreign = await agent.post('/api/auth/active-studio').set('x-csrf-token', agent.csrf).send({ studioId: other.studioId });
    expect(foreign.status).toBe(403);
    const members = await agent.get(`/api/studios/${other.studioId}/members`);
    expect(members.status).toBe(403);
  });
});

describe('errors', () => {
  it('answers malformed JSON with 400, unknown routes with 404 JSON, big bodies with 413', async () => {
    const a = await agentFor(app);
    const bad = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).set('content-type', 'application/json').send('{"email":');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('malformed_json');
    expect(bad.body.requestId).toBeTruthy();
    const missing = await a.get('/api/no-such-thing');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
    const big = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send({ email: 'a@b.test', password: 'x'.repeat(2 * 1024 * 1024) });
    expect(big.status).toBe(413);
  });

  it('reports validation errors as 422 with field paths', async () => {
    const a = await agentFor(app);
    const res = await a.post('/api/auth/sign-in').set('x-csrf-token', a.csrf).send({ email: 'not-an-email', password: '' });
    expect(res.status).toBe(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['email', 'password']);
  });

  it('reports PostgreSQL and Redis in the health check', async () => {
    const res = await request(app).get('/api/health').expect(200);
    expect(res.body).toEqual({ status: 'ok', postgres: 'up', redis: 'up' });
  });
});

import { beforeAll, describe, expect, it } from 'vitest';
import crypto from 'node:crypto';
import type { Express } from 'express';
import { agentFor, buildApp, type Agent } from '../helpers/api';
import { createStudioWithRoles, type StudioFixture } from '../helpers/fixtures';
import { ROUTE_TABLE, type RouteRow } from './route-table';

const ROLES = ['owner', 'photographer', 'retoucher', 'guest'] as const;
let app: Express;
let fx: StudioFixture;
const agents = {} as Record<(typeof ROLES)[number], Agent>;

beforeAll(async () => {
  app = await buildApp();
  fx = await createStudioWithRoles('Route Table Studio');
  for (const role of ROLES) agents[role] = await agentFor(app, fx.users[role]);
});

function concrete(path: string): string {
  return path.replace(':studioId', fx.studioId).replace(/:[A-Za-z]+Id\b/g, () => crypto.randomUUID()).replace(/:token\b/g, 'no-such-token');
}

async function call(agent: Agent, r: RouteRow) {
  const req = agent[r.method](concrete(r.path)).set('x-csrf-token', agent.csrf);
  return r.method === 'get' || r.method === 'delete' ? req : req.send({});
}

function check(status: number, expected: RouteRow['anon'], label: string) {
  if (expected === 'ok') expect(status, label).not.toBeOneOf([401, 403]);
  else expect(status, label).toBe(expected);
}

describe('route × role table', () => {
  it('lists every route the app registers, and nothing else', async () => {
    const { registeredRoutes } = await import('../../server/lib/route');
    const registered = registeredRoutes.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    const table = ROUTE_TABLE.map((r) => `${r.method.toUpperCase()} ${r.path}`).sort();
    expect(registered.length).toBeGreaterThan(10);
    expect(registered).toEqual(table);
  });

  for (const r of ROUTE_TABLE) {
    it(`${r.method.toUpperCase()} ${r.path}`, async () => {
      const anon = await agentFor(app);
      check((await call(anon, r)).status, r.anon, 'anonymous');
      for (const role of ROLES) {
        const agent = r.endsSession ? await agentFor(app, fx.users[role]) : agents[role];
        check((await call(agent, r)).status, r[role], role);
      }
    });
  }

  it('refuses members of one studio on another studio’s routes', async () => {
    const other = await createStudioWithRoles('Elsewhere');
    const res = await agents.owner.get(`/api/studios/${other.studioId}/members`);
    expect(res.status).toBe(403);
  });
});

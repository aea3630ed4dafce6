// Builds the app against the services the global setup started, and signs agents in.
import { inject } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';

export function useTestEnv() {
  Object.assign(process.env, {
    DATABASE_URL: inject('databaseUrl'),
    REDIS_URL: inject('redisUrl'),
    SMTP_URL: inject('smtpUrl'),
    LAMELLA_DATA_DIR: `${inject('dataDir')}/files`,
    NODE_ENV: 'test',
    SESSION_SECRET: 'test-secret-for-lamella-only',
  });
}

export async function buildApp(): Promise<Express> {
  useTestEnv();
  const { initDataSource } = await import('../../server/lib/data-source');
  await initDataSource();
  const { createApp } = await import('../../server/app');
  return createApp();
}

export type Agent = ReturnType<typeof request.agent> & { csrf: string };

/**
 * An agent with a session and its CSRF token; signs in when credentials are given. `app` is the
 * Express app (API tests) or the base URL of a listening server (browser tests).
 */
export async function agentFor(app: Express | string, creds?: { email: string; password: string }): Promise<Agent> {
  const agent = request.agent(app) as Agent;
  const res = await agent.get('/api/auth/csrf').expect(200);
  agent.csrf = res.body.csrfToken;
  if (creds) {
    const signIn = await agent.post('/api/auth/sign-in').set('x-csrf-token', agent.csrf).send(creds);
    if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status} ${JSON.stringify(signIn.body)}`);
    agent.csrf = signIn.body.csrfToken;
  }
  return agent;
}

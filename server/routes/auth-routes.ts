import type { Request } from 'express';
import { Router } from 'express';
import {
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  signInSchema,
  invitationAcceptSchema,
  activeStudioSchema,
  studioCreateSchema,
} from '../../shared/schemas/auth';
import { mountRoutes, PUBLIC, SIGNED_IN } from '../lib/route';
import { parse } from '../lib/validate';
import { Forbidden } from '../lib/errors';
import { authenticate } from '../services/auth-service';
import { confirmPasswordReset, requestPasswordReset } from '../services/password-reset-service';
import { acceptInvitation, describeInvitation } from '../services/invitation-service';
import { createStudio, findMembership, studiosOf } from '../services/membership-service';
import { getDataSource } from '../lib/data-source';
import { User } from '../entities/user';
import { csrfToken } from '../lib/csrf';

function logIn(req: Request, user: Express.User): Promise<void> {
  // passport ≥ 0.6 regenerates the session id here, so a planted session id is worthless.
  return new Promise((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

function toSessionUser(u: User): Express.User {
  return { id: u.id, email: u.email, name: u.name, lastStudioId: u.lastStudioId };
}

async function meView(user: Express.User) {
  const studios = await studiosOf(user.id);
  const active = studios.find((s) => s.id === user.lastStudioId) ?? studios[0] ?? null;
  return { id: user.id, email: user.email, name: user.name, studios, activeStudioId: active?.id ?? null };
}

export function authRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/auth', [
    {
      method: 'get', path: '/csrf', access: PUBLIC,
      handler: (req, res) => res.json({ csrfToken: csrfToken(req) }),
    },
    {
      method: 'post', path: '/sign-in', access: PUBLIC,
      handler: async (req, res) => {
        const { email, password } = parse(signInSchema, req.body);
        const user = await authenticate(email, password, req.ip ?? 'unknown');
        if (!user) {
          res.status(401).json({ error: { code: 'bad_credentials', message: 'That e-mail and password do not match an account.' }, requestId: req.id });
          return;
        }
        await logIn(req, toSessionUser(user));
        res.json({ me: await meView(toSessionUser(user)), csrfToken: csrfToken(req) });
      },
    },
    {
      method: 'post', path: '/sign-out', access: PUBLIC,
      handler: async (req, res) => {
        await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
        await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
        res.clearCookie('lamella.sid');
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/me', access: SIGNED_IN,
      handler: async (req, res) => res.json(await meView(req.user!)),
    },
    {
      method: 'post', path: '/active-studio', access: SIGNED_IN,
      handler: async (req, res) => {
        const { studioId } = parse(activeStudioSchema, req.body);
        if (!(await findMembership(studioId, req.user!.id))) throw new Forbidden('You are not a member of this studio.');
        await getDataSource().getRepository(User).update({ id: req.user!.id }, { lastStudioId: studioId });
        req.user!.lastStudioId = studioId;
        res.json(await meView(req.user!));
      },
    },
    {
      method: 'post', path: '/studios', access: SIGNED_IN,
      handler: async (req, res) => {
        const { name } = parse(studioCreateSchema, req.body);
        const studio = await createStudio(name, req.user!.id);
        req.user!.lastStudioId = studio.id;
        res.status(201).json(await meView(req.user!));
      },
    },
    {
      method: 'post', path: '/password-reset', access: PUBLIC,
      handler: async (req, res) => {
        const { email } = parse(passwordResetRequestSchema, req.body);
        await requestPasswordReset(email);
        res.status(202).json({ message: 'If that e-mail has an account, a reset link is on its way.' });
      },
    },
    {
      method: 'post', path: '/password-reset/:token', access: PUBLIC,
      handler: async (req, res) => {
        const { password } = parse(passwordResetConfirmSchema, req.body);
        await confirmPasswordReset(String(req.params.token), password);
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/invitations/:token', access: PUBLIC,
      handler: async (req, res) => res.json(await describeInvitation(String(req.params.token))),
    },
    {
      method: 'post', path: '/invitations/:token/accept', access: PUBLIC,
      handler: async (req, res) => {
        const input = parse(invitationAcceptSchema, req.body);
        const user = await acceptInvitation(String(req.params.token), input);
        await logIn(req, toSessionUser(user));
        res.json({ me: await meView(toSessionUser(user)), csrfToken: csrfToken(req) });
      },
    },
  ]);
  return router;
}

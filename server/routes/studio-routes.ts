import { Router } from 'express';
import { invitationCreateSchema, memberUpdateSchema } from '../../shared/schemas/auth';
import { ALL_MEMBERS } from '../../shared/roles';
import { mountRoutes, studioRoles } from '../lib/route';
import { parse } from '../lib/validate';
import { listMembers, updateMember } from '../services/membership-service';
import { createInvitation, listPendingInvitations, revokeInvitation } from '../services/invitation-service';
import { listCaughtMail } from '../services/caught-mail-service';
import { env } from '../lib/env';
import { NotFound } from '../lib/errors';

export function studioRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId', [
    {
      method: 'get', path: '/members', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json({ members: await listMembers(req.member!.studioId) }),
    },
    {
      method: 'patch', path: '/members/:memberId', access: studioRoles('owner'),
      handler: async (req, res) => {
        const { role } = parse(memberUpdateSchema, req.body);
        await updateMember(req.member!.studioId, String(req.params.memberId), { role });
        res.json({ members: await listMembers(req.member!.studioId) });
      },
    },
    {
      method: 'delete', path: '/members/:memberId', access: studioRoles('owner'),
      handler: async (req, res) => {
        await updateMember(req.member!.studioId, String(req.params.memberId), 'remove');
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/invitations', access: studioRoles('owner'),
      handler: async (req, res) => res.json({ invitations: await listPendingInvitations(req.member!.studioId) }),
    },
    {
      method: 'post', path: '/invitations', access: studioRoles('owner'),
      handler: async (req, res) => {
        const { email, role } = parse(invitationCreateSchema, req.body);
        res.status(201).json(await createInvitation(req.member!.studioId, req.user!.id, email, role));
      },
    },
    {
      method: 'delete', path: '/invitations/:invitationId', access: studioRoles('owner'),
      handler: async (req, res) => {
        await revokeInvitation(req.member!.studioId, String(req.params.invitationId));
        res.status(204).end();
      },
    },
    {
      method: 'get', path: '/dev/mail', access: studioRoles('owner'),
      handler: async (req, res) => {
        if (env().MAIL_CATCHER !== 'on') throw new NotFound('Caught mail is only kept where the local mail catcher runs.');
        res.json({ messages: await listCaughtMail(req.member!.studioId) });
      },
    },
  ]);
  return router;
}

import { Router } from 'express';
import { ALL_MEMBERS, CAN_EDIT_WORK } from '../../shared/roles';
import { mountRoutes, studioRoles } from '../lib/route';
import { createPlan, deletePlan, duplicatePlan, getPlan, listPlans, previewPlan, updatePlan } from '../services/plan-service';

/** Plans: every member (guests included) reads; owners and photographers write. */
export function planRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId', [
    {
      method: 'get', path: '/plans', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json({ plans: await listPlans(req.member!.studioId) }),
    },
    {
      method: 'post', path: '/plans', access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => res.status(201).json(await createPlan(req.member!.studioId, req.user!.id, req.body)),
    },
    {
      // Computes without saving, so any member may try figures.
      method: 'post', path: '/plans/preview', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json(previewPlan(req.body)),
    },
    {
      method: 'get', path: '/plans/:planId', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json(await getPlan(req.member!.studioId, String(req.params.planId))),
    },
    {
      method: 'patch', path: '/plans/:planId', access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => res.json(await updatePlan(req.member!.studioId, String(req.params.planId), req.body)),
    },
    {
      method: 'delete', path: '/plans/:planId', access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => {
        await deletePlan(req.member!.studioId, String(req.params.planId));
        res.status(204).end();
      },
    },
    {
      method: 'post', path: '/plans/:planId/duplicate', access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => res.status(201).json(await duplicatePlan(req.member!.studioId, req.user!.id, String(req.params.planId))),
    },
  ]);
  return router;
}

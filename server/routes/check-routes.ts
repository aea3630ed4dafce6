// Stack checks on the stack page, and the studio's check thresholds.
import { Router } from 'express';
import { ALL_MEMBERS, CAN_EDIT_WORK } from '../../shared/roles';
import { mountRoutes, studioRoles } from '../lib/route';
import { stackForMember } from '../services/stack-access';
import { checkThresholdsView, saveCheckThresholds, stackChecksView } from '../services/check-results-service';

export function checkRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId', [
    {
      method: 'get', path: '/stacks/:stackId/checks', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json(await stackChecksView(await stackForMember(req.member!, req.user!.id, String(req.params.stackId)))),
    },
    {
      method: 'get', path: '/check-thresholds', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json(await checkThresholdsView(req.member!.studioId)),
    },
    {
      method: 'put', path: '/check-thresholds', access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => res.json(await saveCheckThresholds(req.member!.studioId, req.body ?? {}, req.user!.id)),
    },
  ]);
  return router;
}

import { Router } from 'express';
import { ALL_MEMBERS, CAN_EDIT_WORK } from '../../shared/roles';
import { KIT_KINDS, type KitKind } from '../../shared/kit-presets';
import { mountRoutes, studioRoles, type RouteDef } from '../lib/route';
import { createKitItem, deleteKitItem, listKit, listKitItems, updateKitItem } from '../services/kit-service';

const ID_PARAM: Record<KitKind, string> = {
  bodies: 'bodyId',
  lenses: 'lensId',
  'extension-sets': 'extensionSetId',
  rails: 'railId',
};

function kindRoutes(kind: KitKind): RouteDef[] {
  const param = ID_PARAM[kind];
  return [
    {
      method: 'get', path: `/kit/${kind}`, access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json({ items: await listKitItems(req.member!.studioId, kind) }),
    },
    {
      method: 'post', path: `/kit/${kind}`, access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => res.status(201).json(await createKitItem(req.member!.studioId, kind, req.body)),
    },
    {
      method: 'patch', path: `/kit/${kind}/:${param}`, access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => res.json(await updateKitItem(req.member!.studioId, kind, String(req.params[param]), req.body)),
    },
    {
      method: 'delete', path: `/kit/${kind}/:${param}`, access: studioRoles(...CAN_EDIT_WORK),
      handler: async (req, res) => {
        await deleteKitItem(req.member!.studioId, kind, String(req.params[param]));
        res.status(204).end();
      },
    },
  ];
}

/** The studio's kit: all members read, owners and photographers change it. */
export function kitRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId', [
    {
      method: 'get', path: '/kit', access: studioRoles(...ALL_MEMBERS),
      handler: async (req, res) => res.json(await listKit(req.member!.studioId)),
    },
    ...KIT_KINDS.flatMap(kindRoutes),
  ]);
  return router;
}

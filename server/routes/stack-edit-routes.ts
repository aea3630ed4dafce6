// Hand edits on the sorting, mounted under /api/studios/:studioId/sessions by session-routes.ts.
// Each answers with the new sorting view.
import type { Request } from 'express';
import type { Access, RouteDef } from '../lib/route';
import { parse } from '../lib/validate';
import {
  excludeFramesSchema, moveFramesSchema, reorderFramesSchema, splitStackSchema, stackPatchSchema, stackStateChangeSchema,
} from '../../shared/schemas/stack-edits';
import {
  mergeWithNext, moveFrames, patchStack, reorderFrames, setFramesExcluded, setStackState, splitStack, stackEvents, type Actor,
} from '../services/stack-edit-service';

const actorOf = (req: Request): Actor => ({ userId: req.user!.id, label: req.user!.name || req.user!.email });
const ids = (req: Request) => ({ studioId: req.member!.studioId, sessionId: String(req.params.sessionId), stackId: String(req.params.stackId ?? '') });

export function stackEditRoutes(editors: Access, readers: Access): RouteDef[] {
  return [
    {
      method: 'post', path: '/:sessionId/stacks/:stackId/split', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId, stackId } = ids(req);
        res.json(await splitStack(studioId, sessionId, stackId, parse(splitStackSchema, req.body).frameId, actorOf(req)));
      },
    },
    {
      method: 'post', path: '/:sessionId/stacks/:stackId/merge-next', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId, stackId } = ids(req);
        res.json(await mergeWithNext(studioId, sessionId, stackId, actorOf(req)));
      },
    },
    {
      method: 'patch', path: '/:sessionId/stacks/:stackId', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId, stackId } = ids(req);
        res.json(await patchStack(studioId, sessionId, stackId, parse(stackPatchSchema, req.body), actorOf(req)));
      },
    },
    {
      method: 'post', path: '/:sessionId/stacks/:stackId/state', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId, stackId } = ids(req);
        res.json(await setStackState(studioId, sessionId, stackId, parse(stackStateChangeSchema, req.body).state, actorOf(req)));
      },
    },
    {
      method: 'post', path: '/:sessionId/stacks/:stackId/order', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId, stackId } = ids(req);
        res.json(await reorderFrames(studioId, sessionId, stackId, parse(reorderFramesSchema, req.body).frameIds, actorOf(req)));
      },
    },
    {
      method: 'get', path: '/:sessionId/stacks/:stackId/events', access: readers,
      handler: async (req, res) => {
        const { studioId, sessionId, stackId } = ids(req);
        res.json({ events: await stackEvents(studioId, sessionId, stackId) });
      },
    },
    {
      method: 'post', path: '/:sessionId/frames/move', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId } = ids(req);
        const { frameIds, toStackId } = parse(moveFramesSchema, req.body);
        res.json(await moveFrames(studioId, sessionId, frameIds, toStackId, actorOf(req)));
      },
    },
    {
      method: 'post', path: '/:sessionId/frames/exclusion', access: editors,
      handler: async (req, res) => {
        const { studioId, sessionId } = ids(req);
        const { frameIds, excluded } = parse(excludeFramesSchema, req.body);
        res.json(await setFramesExcluded(studioId, sessionId, frameIds, excluded, actorOf(req)));
      },
    },
  ];
}

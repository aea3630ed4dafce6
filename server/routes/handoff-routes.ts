// Hand-off of a stack inside a studio: the panel on the stack page, the steps, share links,
// the retoucher's list, bundle download and the merged result.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { ALL_MEMBERS, CAN_EDIT_WORK } from '../../shared/roles';
import { shareLinkCreateSchema } from '../../shared/schemas/handoff';
import { mountRoutes, studioRoles } from '../lib/route';
import { parse } from '../lib/validate';
import { NotFound } from '../lib/errors';
import { getStore } from '../lib/storage';
import { addShareLink, archiveStack, handOffStack, revokeShareLink, takeBackStack, type Editor } from '../services/handoff-service';
import { handoffView, myHandoffs } from '../services/handoff-view-service';
import { downloadAsMember } from '../services/handoff-download';
import { askForBundle } from '../services/handoff-bundle';
import { attachMergedResult, mergedResultOf } from '../services/merged-result-service';
import { stackForMember } from '../services/stack-access';
import { mergedFileOf, receiveMergedFile, sendStream } from './handoff-helpers';

const editors = studioRoles(...CAN_EDIT_WORK);
const members = studioRoles(...ALL_MEMBERS);
const workers = studioRoles('owner', 'photographer', 'retoucher');

const labelOf = (req: Request) => req.user!.name || req.user!.email;
const editorOf = (req: Request): Editor => ({ userId: req.user!.id, label: labelOf(req), email: req.user!.email });
const stackIdOf = (req: Request) => String(req.params.stackId);
const sizeSchema = z.enum(['small', 'large'], 'Ask for the small or the large preview.');

export function handoffRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId', [
    {
      method: 'get', path: '/handoffs/mine', access: members,
      handler: async (req, res) => res.json({ handoffs: await myHandoffs(req.member!.studioId, req.user!.id) }),
    },
    {
      method: 'get', path: '/stacks/:stackId/handoff', access: members,
      handler: async (req, res) => res.json(await handoffView(req.member!, req.user!.id, stackIdOf(req))),
    },
    {
      method: 'post', path: '/stacks/:stackId/handoff', access: editors,
      handler: async (req, res) => {
        const { shareLink } = await handOffStack(req.member!.studioId, stackIdOf(req), editorOf(req), req.body);
        res.status(201).json({ shareLink, handoff: await handoffView(req.member!, req.user!.id, stackIdOf(req)) });
      },
    },
    {
      method: 'post', path: '/stacks/:stackId/handoff/take-back', access: editors,
      handler: async (req, res) => {
        await takeBackStack(req.member!.studioId, stackIdOf(req), editorOf(req));
        res.json(await handoffView(req.member!, req.user!.id, stackIdOf(req)));
      },
    },
    {
      method: 'post', path: '/stacks/:stackId/handoff/archive', access: editors,
      handler: async (req, res) => {
        await archiveStack(req.member!.studioId, stackIdOf(req), editorOf(req));
        res.json(await handoffView(req.member!, req.user!.id, stackIdOf(req)));
      },
    },
    {
      method: 'post', path: '/stacks/:stackId/handoff/share-links', access: editors,
      handler: async (req, res) => {
        const { expiryDays } = parse(shareLinkCreateSchema, req.body ?? {});
        const shareLink = await addShareLink(req.member!.studioId, stackIdOf(req), editorOf(req), expiryDays);
        res.status(201).json({ shareLink, handoff: await handoffView(req.member!, req.user!.id, stackIdOf(req)) });
      },
    },
    {
      method: 'delete', path: '/stacks/:stackId/handoff/share-links/:linkId', access: editors,
      handler: async (req, res) => {
        await revokeShareLink(req.member!.studioId, stackIdOf(req), String(req.params.linkId), editorOf(req));
        res.json(await handoffView(req.member!, req.user!.id, stackIdOf(req)));
      },
    },
    {
      method: 'get', path: '/stacks/:stackId/handoff/bundle', access: workers,
      handler: async (req, res) => {
        const bundle = await downloadAsMember(req.member!, { id: req.user!.id, label: labelOf(req) }, stackIdOf(req));
        await sendStream(res, bundle.stream, { type: 'application/zip', sizeBytes: bundle.sizeBytes, fileName: bundle.fileName });
      },
    },
    {
      method: 'post', path: '/stacks/:stackId/handoff/bundle', access: workers,
      handler: async (req, res) => {
        const { stack } = await stackForMember(req.member!, req.user!.id, stackIdOf(req));
        const { status, sizeBytes } = await askForBundle(stack, req.user!.id);
        res.status(status === 'ready' ? 200 : 202).json({ status, sizeBytes });
      },
    },
    {
      method: 'post', path: '/stacks/:stackId/handoff/merged', access: workers,
      // Who may send it is settled before the body is read: a refused person uploads nothing.
      before: [
        async (req, _res, next) => {
          await stackForMember(req.member!, req.user!.id, stackIdOf(req));
          next();
        },
        receiveMergedFile,
      ],
      handler: async (req, res) => {
        const result = await attachMergedResult(req.member!.studioId, stackIdOf(req), { userId: req.user!.id, label: labelOf(req) }, mergedFileOf(req), { shareLinkId: null });
        res.status(201).json({ mergedResult: result, handoff: await handoffView(req.member!, req.user!.id, stackIdOf(req)) });
      },
    },
    {
      method: 'get', path: '/stacks/:stackId/handoff/merged/file', access: members,
      handler: async (req, res) => {
        const { stack } = await stackForMember(req.member!, req.user!.id, stackIdOf(req));
        const result = await mergedResultOf(stack.id);
        const ext = result.mime === 'image/jpeg' ? 'jpg' : 'tif';
        await sendStream(res, getStore().createReadStream(result.storageKey), { type: result.mime, sizeBytes: result.sizeBytes, fileName: `${stack.name} merged.${ext}` });
      },
    },
    {
      method: 'get', path: '/stacks/:stackId/handoff/merged/preview/:size', access: members,
      handler: async (req, res) => {
        const { stack } = await stackForMember(req.member!, req.user!.id, stackIdOf(req));
        const size = parse(sizeSchema, req.params.size);
        const result = await mergedResultOf(stack.id);
        const key = size === 'small' ? result.previewSmallKey : result.previewLargeKey;
        if (result.previewStatus !== 'done' || !key) throw new NotFound(result.previewStatus === 'failed' ? (result.previewError ?? 'The preview could not be made.') : 'The preview of the merged result is still being made.');
        await sendStream(res, getStore().createReadStream(key), { type: 'image/jpeg', cache: 'private, max-age=300' });
      },
    },
  ]);
  return router;
}

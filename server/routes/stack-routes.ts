// The stack page, its contact sheet and its bundles; session bundles. Every stack route checks the
// stack against the member (a retoucher sees only the stacks handed to them).
import { Router, type Request, type Response } from 'express';
import { pipeline } from 'node:stream/promises';
import { ALL_MEMBERS, CAN_EDIT_WORK } from '../../shared/roles';
import { bundleRequestSchema } from '../../shared/schemas/bundles';
import { mountRoutes, studioRoles } from '../lib/route';
import { parse } from '../lib/validate';
import { getStore } from '../lib/storage';
import { stackForMember } from '../services/stack-access';
import { stackDetail, stackFramePreviewKey } from '../services/stack-detail-service';
import { contactSheetKey, requestContactSheet } from '../services/contact-sheet-service';
import {
  attachmentDisposition, bundleForMember, bundleView, latestSessionBundle, latestStackBundle, openBundleForDownload, requestSessionBundle, requestStackBundle,
} from '../services/bundle-service';

const editors = studioRoles(...CAN_EDIT_WORK);
const members = studioRoles(...ALL_MEMBERS);
// Guests read contact sheets but never download originals.
const downloaders = studioRoles('owner', 'photographer', 'retoucher');
const sessionReaders = studioRoles(...ALL_MEMBERS.filter((r) => r !== 'retoucher'));

const stackOf = (req: Request) => stackForMember(req.member!, req.user!.id, String(req.params.stackId));

async function sendStored(res: Response, key: string, contentType: string, disposition: string) {
  res.setHeader('Content-Type', contentType);
  res.setHeader('Content-Disposition', disposition);
  res.setHeader('Cache-Control', 'private, no-cache');
  await pipeline(getStore().createReadStream(key), res);
}

function contactSheetRoute(ext: 'jpg' | 'pdf', contentType: string) {
  return {
    method: 'get' as const, path: `/stacks/:stackId/contact-sheet.${ext}`, access: members,
    handler: async (req: Request, res: Response) => {
      const found = await stackOf(req);
      const key = await contactSheetKey(found.stack, ext);
      await sendStored(res, key, contentType, `inline; filename="contact-sheet-v${found.stack.version}.${ext}"`);
    },
  };
}

export function stackRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId', [
    { method: 'get', path: '/stacks/:stackId', access: members, handler: async (req, res) => res.json(await stackDetail(await stackOf(req))) },
    {
      method: 'get', path: '/stacks/:stackId/frames/:frameId/preview/:size', access: members,
      handler: async (req, res) => {
        const key = await stackFramePreviewKey(await stackOf(req), String(req.params.frameId), String(req.params.size));
        res.setHeader('Content-Type', 'image/jpeg');
        res.setHeader('Cache-Control', 'private, max-age=300');
        await pipeline(getStore().createReadStream(key), res);
      },
    },
    contactSheetRoute('jpg', 'image/jpeg'),
    contactSheetRoute('pdf', 'application/pdf'),
    {
      method: 'post', path: '/stacks/:stackId/contact-sheet', access: editors,
      handler: async (req, res) => {
        parse(bundleRequestSchema, req.body ?? {});
        res.status(202).json(await requestContactSheet((await stackOf(req)).stack));
      },
    },
    {
      method: 'post', path: '/stacks/:stackId/bundles', access: editors,
      handler: async (req, res) => {
        parse(bundleRequestSchema, req.body ?? {});
        const { stack } = await stackOf(req);
        const { bundle, created } = await requestStackBundle(stack.id, req.user!.id);
        res.status(created ? 202 : 200).json(bundle);
      },
    },
    {
      method: 'get', path: '/stacks/:stackId/bundles/latest', access: members,
      handler: async (req, res) => res.json({ bundle: await latestStackBundle((await stackOf(req)).stack.id) }),
    },
    {
      method: 'get', path: '/bundles/:bundleId', access: members,
      handler: async (req, res) => res.json(await bundleView(await bundleForMember(req.member!, req.user!.id, String(req.params.bundleId)))),
    },
    {
      method: 'get', path: '/bundles/:bundleId/download', access: downloaders,
      handler: async (req, res) => {
        const bundle = await bundleForMember(req.member!, req.user!.id, String(req.params.bundleId));
        const { stream, sizeBytes, fileName } = await openBundleForDownload(bundle.id);
        res.setHeader('Content-Type', 'application/zip');
        res.setHeader('Content-Length', String(sizeBytes));
        res.setHeader('Content-Disposition', attachmentDisposition(fileName));
        res.setHeader('Cache-Control', 'private, no-store');
        await pipeline(stream, res);
      },
    },
    {
      method: 'post', path: '/sessions/:sessionId/bundles', access: editors,
      handler: async (req, res) => {
        parse(bundleRequestSchema, req.body ?? {});
        const { bundle, created } = await requestSessionBundle(req.member!.studioId, String(req.params.sessionId), req.user!.id);
        res.status(created ? 202 : 200).json(bundle);
      },
    },
    {
      method: 'get', path: '/sessions/:sessionId/bundles/latest', access: sessionReaders,
      handler: async (req, res) => res.json({ bundle: await latestSessionBundle(req.member!.studioId, String(req.params.sessionId)) }),
    },
  ]);
  return router;
}

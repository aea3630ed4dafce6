// Public routes behind a share link, for an outside retoucher without an account. The token is
// the only credential: every route opens it first and refuses unknown, revoked and expired links.
import { Router, type Request } from 'express';
import { mountRoutes, PUBLIC } from '../lib/route';
import { getStore } from '../lib/storage';
import { openShareLink, type OpenedLink } from '../services/share-link-service';
import { sharePageView } from '../services/handoff-view-service';
import { downloadThroughLink } from '../services/handoff-download';
import { askForBundle } from '../services/handoff-bundle';
import { attachMergedResult } from '../services/merged-result-service';
import { contactSheetKey } from '../services/contact-sheet-service';
import { mergedFileOf, receiveMergedFile, sendStream } from './handoff-helpers';

const tokenOf = (req: Request) => String(req.params.token);

export function shareRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/share/:token', [
    {
      method: 'get', path: '', access: PUBLIC,
      handler: async (req, res) => {
        res.setHeader('Cache-Control', 'no-store');
        res.json(await sharePageView(await openShareLink(tokenOf(req))));
      },
    },
    {
      method: 'get', path: '/contact-sheet.jpg', access: PUBLIC,
      handler: async (req, res) => {
        const { stack } = await openShareLink(tokenOf(req));
        const key = await contactSheetKey(stack, 'jpg');
        await sendStream(res, getStore().createReadStream(key), { type: 'image/jpeg' });
      },
    },
    {
      method: 'get', path: '/bundle', access: PUBLIC,
      handler: async (req, res) => {
        const bundle = await downloadThroughLink(await openShareLink(tokenOf(req)));
        await sendStream(res, bundle.stream, { type: 'application/zip', sizeBytes: bundle.sizeBytes, fileName: bundle.fileName });
      },
    },
    {
      method: 'post', path: '/bundle', access: PUBLIC,
      handler: async (req, res) => {
        const { stack, link } = await openShareLink(tokenOf(req));
        const { status, sizeBytes } = await askForBundle(stack, link.createdBy);
        res.status(status === 'ready' ? 200 : 202).json({ status, sizeBytes });
      },
    },
    {
      method: 'post', path: '/merged', access: PUBLIC,
      // The link is checked before the body is read: a dead link uploads nothing.
      before: [
        async (req, res, next) => {
          res.locals.shareLink = await openShareLink(tokenOf(req));
          next();
        },
        receiveMergedFile,
      ],
      handler: async (req, res) => {
        const { link, session } = res.locals.shareLink as OpenedLink;
        const result = await attachMergedResult(session.studioId, link.stackId, { userId: null, label: `${link.email} (share link)` }, mergedFileOf(req), { shareLinkId: link.id });
        res.status(201).json({ mergedResult: result, share: await sharePageView(await openShareLink(tokenOf(req))) });
      },
    },
  ]);
  return router;
}

import { Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { ALL_MEMBERS, CAN_EDIT_WORK } from '../../shared/roles';
import { groupingOptionsSchema, hashCheckSchema, importCreateSchema, sessionCreateSchema, sessionUpdateSchema } from '../../shared/schemas/sessions';
import { mountRoutes, studioRoles } from '../lib/route';
import { parse } from '../lib/validate';
import { env } from '../lib/env';
import { BadInput } from '../lib/errors';
import { cardStorageEngine, type ReceivedCardFile } from '../lib/card-upload';
import { createSession, deleteSession, getSessionRow, listSessions, updateSession } from '../services/session-service';
import { completeImport, createImport, knownHashes, listImports, recordUploadedFiles } from '../services/card-import-service';
import { regroupSession, undoLast } from '../services/sorting-service';
import { listSessionFiles, previewKey, sortingView } from '../services/sorting-view-service';
import { getStore } from '../lib/storage';
import { pipeline } from 'node:stream/promises';
import { stackEditRoutes } from './stack-edit-routes';

const MAX_FILES_PER_REQUEST = 50;

const upload = multer({
  storage: cardStorageEngine(() => env().UPLOAD_MAX_BYTES),
  defParamCharset: 'utf8',
  limits: { files: MAX_FILES_PER_REQUEST, fields: 200, fieldSize: 64 * 1024, parts: 2 * MAX_FILES_PER_REQUEST + 10 },
});

const mtimesSchema = z.array(z.union([z.coerce.number().int().min(0).max(8.64e15), z.literal('')]));

function mtimesOf(body: Record<string, unknown>, count: number): (number | null)[] {
  const raw = body.lastModified;
  const list = raw === undefined ? [] : Array.isArray(raw) ? raw : [raw];
  const parsed = mtimesSchema.safeParse(list);
  if (!parsed.success) return Array(count).fill(null);
  return Array.from({ length: count }, (_, i) => (typeof parsed.data[i] === 'number' ? (parsed.data[i] as number) : null));
}

const editors = studioRoles(...CAN_EDIT_WORK);
const readers = studioRoles(...ALL_MEMBERS.filter((r) => r !== 'retoucher'));

export function sessionRouter(): Router {
  const router = Router();
  mountRoutes(router, '/api/studios/:studioId/sessions', [
    { method: 'get', path: '', access: readers, handler: async (req, res) => res.json({ sessions: await listSessions(req.member!.studioId) }) },
    {
      method: 'post', path: '', access: editors,
      handler: async (req, res) => res.status(201).json(await createSession(req.member!.studioId, req.user!.id, parse(sessionCreateSchema, req.body))),
    },
    { method: 'get', path: '/:sessionId', access: readers, handler: async (req, res) => res.json(await getSessionRow(req.member!.studioId, String(req.params.sessionId))) },
    {
      method: 'patch', path: '/:sessionId', access: editors,
      handler: async (req, res) => res.json(await updateSession(req.member!.studioId, String(req.params.sessionId), parse(sessionUpdateSchema, req.body))),
    },
    {
      method: 'delete', path: '/:sessionId', access: studioRoles('owner'),
      handler: async (req, res) => {
        await deleteSession(req.member!.studioId, String(req.params.sessionId));
        res.status(204).end();
      },
    },
    { method: 'get', path: '/:sessionId/sorting', access: readers, handler: async (req, res) => res.json(await sortingView(req.member!.studioId, String(req.params.sessionId))) },
    { method: 'get', path: '/:sessionId/files', access: readers, handler: async (req, res) => res.json({ files: await listSessionFiles(req.member!.studioId, String(req.params.sessionId)) }) },
    { method: 'get', path: '/:sessionId/imports', access: readers, handler: async (req, res) => res.json({ imports: await listImports(req.member!.studioId, String(req.params.sessionId)) }) },
    {
      method: 'post', path: '/:sessionId/imports', access: editors,
      handler: async (req, res) => {
        const { expectedFiles } = parse(importCreateSchema, req.body);
        res.status(201).json(await createImport(req.member!.studioId, String(req.params.sessionId), req.user!.id, expectedFiles));
      },
    },
    {
      method: 'post', path: '/:sessionId/known-hashes', access: editors,
      handler: async (req, res) => {
        const { sha256 } = parse(hashCheckSchema, req.body);
        res.json({ known: await knownHashes(req.member!.studioId, String(req.params.sessionId), sha256) });
      },
    },
    {
      method: 'post', path: '/:sessionId/imports/:importId/files', access: editors,
      before: [
        (req, res, next) =>
          upload.array('files', MAX_FILES_PER_REQUEST)(req, res, (err?: unknown) => {
            if (!err || err instanceof multer.MulterError) return next(err);
            next(new BadInput(`The upload is not a valid multipart form (${(err as Error).message}). Nothing from it was kept.`));
          }),
      ],
      handler: async (req, res) => {
        const files = (req.files ?? []) as (Express.Multer.File & ReceivedCardFile)[];
        if (!Array.isArray(files) || files.length === 0) throw new BadInput('Send one or more files in the "files" field of a multipart form.');
        try {
          const outcomes = await recordUploadedFiles(req.member!.studioId, String(req.params.sessionId), String(req.params.importId), files, mtimesOf(req.body ?? {}, files.length));
          res.status(201).json({ files: outcomes });
        } catch (err) {
          // A refused request (no such session or import here) keeps no received temp file.
          await Promise.all(files.map((f) => f.discard?.()));
          throw err;
        }
      },
    },
    {
      method: 'post', path: '/:sessionId/imports/:importId/complete', access: editors,
      handler: async (req, res) => res.json(await completeImport(req.member!.studioId, String(req.params.sessionId), String(req.params.importId), req.user!.id)),
    },
    {
      method: 'post', path: '/:sessionId/regroup', access: editors,
      handler: async (req, res) => {
        const options = parse(groupingOptionsSchema, req.body ?? {});
        await regroupSession(req.member!.studioId, String(req.params.sessionId), req.user!.id, { label: 'regroup', options });
        res.json(await sortingView(req.member!.studioId, String(req.params.sessionId)));
      },
    },
    {
      method: 'get', path: '/:sessionId/frames/:frameId/preview/:size', access: readers,
      handler: async (req, res) => {
        const key = await previewKey(req.member!.studioId, String(req.params.sessionId), String(req.params.frameId), String(req.params.size));
        res.setHeader('Content-Type', 'image/jpeg');
        res.setHeader('Cache-Control', 'private, max-age=300');
        await pipeline(getStore().createReadStream(key), res);
      },
    },
    {
      method: 'post', path: '/:sessionId/undo', access: editors,
      handler: async (req, res) => {
        const { undone } = await undoLast(req.member!.studioId, String(req.params.sessionId));
        res.json({ undone, sorting: await sortingView(req.member!.studioId, String(req.params.sessionId)) });
      },
    },
    ...stackEditRoutes(editors, readers),
  ]);
  return router;
}

// HTTP pieces the hand-off and share routes share: the merged-result upload and file answers.
import { pipeline } from 'node:stream/promises';
import type { Readable } from 'node:stream';
import type { Request, RequestHandler, Response } from 'express';
import multer from 'multer';
import { BadInput } from '../lib/errors';
import { cardStorageEngine } from '../lib/card-upload';
import type { UploadedMerged } from '../services/merged-result-service';
import { attachmentDisposition } from '../services/bundle-service';

// A merged 16-bit TIFF of a high-resolution body runs to several hundred MB; 1 GiB leaves room.
export const MERGED_MAX_BYTES = 1024 ** 3;

const upload = multer({
  storage: cardStorageEngine(() => MERGED_MAX_BYTES),
  defParamCharset: 'utf8',
  limits: { files: 1, fields: 10, fieldSize: 4 * 1024, parts: 12 },
});

/** Receives one file in the "file" field, sniffed and streamed to storage (not yet committed). */
export const receiveMergedFile: RequestHandler = (req, res, next) =>
  upload.single('file')(req, res, (err?: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_UNEXPECTED_FILE') return next(new BadInput('Send one merged picture, in the "file" field.'));
      return next(err);
    }
    next(new BadInput(`The upload is not a valid multipart form (${(err as Error).message}). Nothing from it was kept.`));
  });

export const mergedFileOf = (req: Request) => req.file as unknown as UploadedMerged | undefined;

export async function sendStream(res: Response, stream: Readable, opts: { type: string; sizeBytes?: number | null; fileName?: string; cache?: string }) {
  res.setHeader('Content-Type', opts.type);
  if (opts.sizeBytes) res.setHeader('Content-Length', String(opts.sizeBytes));
  if (opts.fileName) res.setHeader('Content-Disposition', attachmentDisposition(opts.fileName));
  res.setHeader('Cache-Control', opts.cache ?? 'private, no-store');
  await pipeline(stream, res);
}

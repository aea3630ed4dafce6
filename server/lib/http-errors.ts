import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import multer from 'multer';
import { AppError, TooManyRequests } from './errors';

function send(res: Parameters<RequestHandler>[1], reqId: unknown, status: number, code: string, message: string, details?: unknown) {
  res.status(status).json({ error: { code, message, ...(details === undefined ? {} : { details }) }, requestId: reqId });
}

export const notFoundApi: RequestHandler = (req, res) => {
  send(res, req.id, 404, 'not_found', `No API route for ${req.method} ${req.path}.`);
};

/** One error handler: typed errors map to their status; anything else is a 500 with a request id. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) {
    req.log?.error({ err }, 'error after headers were sent');
    res.destroy();
    return;
  }
  if (err instanceof ZodError) {
    const details = err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    const first = details[0];
    send(res, req.id, 422, 'validation_failed', first ? `${first.path || 'input'}: ${first.message}` : 'Invalid input.', details);
    return;
  }
  if (err instanceof TooManyRequests) res.setHeader('Retry-After', String(err.retryAfterS));
  if (err instanceof AppError) {
    send(res, req.id, err.status, err.code, err.message, err.details);
    return;
  }
  if (err instanceof multer.MulterError) {
    const status = err.code === 'LIMIT_FILE_SIZE' ? 413 : 400;
    send(res, req.id, status, err.code.toLowerCase(), err.code === 'LIMIT_FILE_SIZE' ? 'The file is larger than the upload limit.' : `Upload refused: ${err.message}.`);
    return;
  }
  const e = err as { type?: string; status?: number; statusCode?: number; code?: string; message?: string };
  if (e.type === 'entity.parse.failed') return send(res, req.id, 400, 'malformed_json', 'The request body is not valid JSON.');
  if (e.type === 'entity.too.large') return send(res, req.id, 413, 'body_too_large', 'The request body is larger than allowed.');
  if (e.code === 'csrf') return send(res, req.id, 403, 'csrf', e.message ?? 'CSRF token missing or wrong.');
  const status = e.status ?? e.statusCode;
  if (status && status >= 400 && status < 500) return send(res, req.id, status, 'bad_request', e.message ?? 'Bad request.');
  req.log?.error({ err }, 'unhandled error');
  send(res, req.id, 500, 'internal', 'Something went wrong on our side. Quote the request id if you report it.');
};

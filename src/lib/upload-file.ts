// One file per multipart request through XMLHttpRequest (fetch reports no upload progress), with the
// CSRF token like every state-changing call of the API client, and its errors in the same shape.
import { ApiError, getCsrfToken, type ApiErrorBody } from './api-client';

// Multipart headers cannot carry C0 control characters (the server's parser refuses the part);
// the server drops them from the shown name anyway.
// eslint-disable-next-line no-control-regex -- removing control characters is the point
const C0_CONTROLS = /[\u0000-\u001f\u007f]/g;

export interface UploadOptions {
  onProgress: (loadedBytes: number) => void;
  signal?: AbortSignal;
}

export interface UploadRequest {
  url: string;
  file: File;
  /** The multipart field that carries the file. */
  field: string;
  /** Text fields sent before the file (the server reads them as the file arrives). */
  fields?: Record<string, string>;
  fallbackName: string;
}

function send(req: UploadRequest, csrf: string, { onProgress, signal }: UploadOptions): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    const form = new FormData();
    for (const [name, value] of Object.entries(req.fields ?? {})) form.append(name, value);
    form.append(req.field, req.file, req.file.name.replace(C0_CONTROLS, '') || req.fallbackName);
    xhr.open('POST', req.url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('X-CSRF-Token', csrf);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => onProgress(Math.min(e.loaded, req.file.size));
    xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The connection broke off during the upload. Nothing was changed; try again.'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** Uploads and answers the server's JSON on 201; a stale CSRF token is renewed once. */
export async function uploadFile<T>(req: UploadRequest, options: UploadOptions): Promise<T> {
  let res = await send(req, await getCsrfToken(), options);
  const errorOf = (body: unknown) => (body as ApiErrorBody | null)?.error;
  if (res.status === 403 && errorOf(res.body)?.code === 'csrf') res = await send(req, await getCsrfToken(true), options);
  if (res.status === 201) return res.body as T;
  const err = errorOf(res.body);
  throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The upload failed (${res.status}).`, err?.details);
}

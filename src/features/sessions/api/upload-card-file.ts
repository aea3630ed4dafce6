// One card file per request, through XMLHttpRequest: fetch reports no upload progress.
import { ApiError, getCsrfToken, type ApiErrorBody } from '@/lib/api-client';
import type { FileOutcome } from '@shared/schemas/session-views';

// Multipart headers cannot carry C0 control characters (the server's parser refuses the part);
// the server drops them from the shown name anyway.
// eslint-disable-next-line no-control-regex -- removing control characters is the point
const C0_CONTROLS = /[\u0000-\u001f\u007f]/g;

export interface UploadOptions {
  onProgress: (loadedBytes: number) => void;
  signal?: AbortSignal;
}

function send(url: string, file: File, csrf: string, { onProgress, signal }: UploadOptions): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    const form = new FormData();
    form.append('lastModified', String(file.lastModified || ''));
    form.append('files', file, file.name.replace(C0_CONTROLS, '') || 'unnamed');
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('X-CSRF-Token', csrf);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => onProgress(Math.min(e.loaded, file.size));
    xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The connection broke off during the upload.'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** Uploads one file into a card import; answers the server's outcome for it. */
export async function uploadCardFile(studioId: string, sessionId: string, importId: string, file: File, options: UploadOptions): Promise<FileOutcome> {
  const url = `/api/studios/${studioId}/sessions/${sessionId}/imports/${importId}/files`;
  let res = await send(url, file, await getCsrfToken(), options);
  const errorOf = (body: unknown) => (body as ApiErrorBody | null)?.error;
  if (res.status === 403 && errorOf(res.body)?.code === 'csrf') res = await send(url, file, await getCsrfToken(true), options);
  if (res.status === 201) {
    const outcome = (res.body as { files: FileOutcome[] }).files[0];
    if (outcome) return outcome;
  }
  const err = errorOf(res.body);
  throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The upload failed (${res.status}).`, err?.details);
}

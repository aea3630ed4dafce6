// The merged result, one file per request, through XMLHttpRequest: fetch reports no upload progress.
import { ApiError, getCsrfToken, type ApiErrorBody } from '@/lib/api-client';

export interface UploadProgress {
  onProgress: (loadedBytes: number) => void;
  signal?: AbortSignal;
}

function send(url: string, file: File, csrf: string, { onProgress, signal }: UploadProgress): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    const form = new FormData();
    // eslint-disable-next-line no-control-regex -- multipart headers cannot carry control characters
    form.append('file', file, file.name.replace(/[\u0000-\u001f\u007f]/g, '') || 'merged');
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.setRequestHeader('X-CSRF-Token', csrf);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.responseType = 'json';
    xhr.upload.onprogress = (e) => onProgress(Math.min(e.loaded, file.size));
    xhr.onload = () => resolve({ status: xhr.status, body: xhr.response });
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The connection broke off during the upload. Nothing was changed; try again.'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}

/** Sends the merged picture to `url` (the stack's or the share link's); answers the server's JSON. */
export async function uploadMerged<T>(url: string, file: File, options: UploadProgress): Promise<T> {
  let res = await send(url, file, await getCsrfToken(), options);
  const errorOf = (body: unknown) => (body as ApiErrorBody | null)?.error;
  if (res.status === 403 && errorOf(res.body)?.code === 'csrf') res = await send(url, file, await getCsrfToken(true), options);
  if (res.status === 201) return res.body as T;
  const err = errorOf(res.body);
  throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The upload failed (${res.status}).`, err?.details);
}

export const memberMergedUrl = (studioId: string, stackId: string) => `/api/studios/${studioId}/stacks/${stackId}/handoff/merged`;
export const shareMergedUrl = (token: string) => `/api/share/${encodeURIComponent(token)}/merged`;

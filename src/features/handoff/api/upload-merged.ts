import { uploadFile, type UploadOptions } from '@/lib/upload-file';

export type UploadProgress = UploadOptions;

/** Sends the merged picture to `url` (the stack's or the share link's); answers the server's JSON. */
export function uploadMerged<T>(url: string, file: File, options: UploadProgress): Promise<T> {
  return uploadFile<T>({ url, file, field: 'file', fallbackName: 'merged' }, options);
}

export const memberMergedUrl = (studioId: string, stackId: string) => `/api/studios/${studioId}/stacks/${stackId}/handoff/merged`;
export const shareMergedUrl = (token: string) => `/api/share/${encodeURIComponent(token)}/merged`;

import { ApiError } from '@/lib/api-client';
import { uploadFile, type UploadOptions } from '@/lib/upload-file';
import type { FileOutcome } from '@shared/schemas/session-views';

export type { UploadOptions };

/** Uploads one file into a card import; answers the server's outcome for it. */
export async function uploadCardFile(studioId: string, sessionId: string, importId: string, file: File, options: UploadOptions): Promise<FileOutcome> {
  const url = `/api/studios/${studioId}/sessions/${sessionId}/imports/${importId}/files`;
  const body = await uploadFile<{ files: FileOutcome[] }>(
    { url, file, field: 'files', fields: { lastModified: String(file.lastModified || '') }, fallbackName: 'unnamed' },
    options,
  );
  const outcome = body.files[0];
  if (!outcome) throw new ApiError(500, 'no_outcome', 'The server answered without a result for this file.');
  return outcome;
}

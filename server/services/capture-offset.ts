// The UTC offset the camera recorded with a frame (OffsetTimeOriginal, kept in the primary file's
// metadata), so pages can show capture times on the camera's clock rather than the browser's.
import type { StoredFile } from '../entities/session';

export function captureOffsetMinutes(files: Pick<StoredFile, 'id' | 'metadata'>[], primaryFileId: string | null): number | null {
  const primary = files.find((f) => f.id === primaryFileId) ?? files[0];
  const offset = primary?.metadata?.offsetMinutes;
  return typeof offset === 'number' && Number.isFinite(offset) ? offset : null;
}

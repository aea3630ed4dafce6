import { api } from '@/lib/api-client';

/** Which of these SHA-256 sums the session already stores, so a resumed import skips those files. */
export const checkKnownHashes = (studioId: string, sessionId: string, sha256: string[]) =>
  api.post<{ known: string[] }>(`/api/studios/${studioId}/sessions/${sessionId}/known-hashes`, { sha256 }).then((r) => new Set(r.known));

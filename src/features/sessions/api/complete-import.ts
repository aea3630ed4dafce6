import { api } from '@/lib/api-client';
import type { CardImportView } from '@shared/schemas/session-views';

/** Ends an import: the server pairs frames, groups the session again and queues previews. */
export const completeImport = (studioId: string, sessionId: string, importId: string) =>
  api.post<CardImportView>(`/api/studios/${studioId}/sessions/${sessionId}/imports/${importId}/complete`);

import { api } from '@/lib/api-client';
import type { CardImportView } from '@shared/schemas/session-views';

export const createImport = (studioId: string, sessionId: string, expectedFiles: number) =>
  api.post<CardImportView>(`/api/studios/${studioId}/sessions/${sessionId}/imports`, { expectedFiles });

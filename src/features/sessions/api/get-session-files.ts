import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SessionFileView } from '@shared/schemas/session-views';

export const getSessionFiles = (studioId: string, sessionId: string) =>
  api.get<{ files: SessionFileView[] }>(`/api/studios/${studioId}/sessions/${sessionId}/files`).then((r) => r.files);

export const sessionFilesQueryOptions = (studioId: string, sessionId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'sessions', sessionId, 'files'], queryFn: () => getSessionFiles(studioId, sessionId) });

export const useSessionFiles = (studioId: string, sessionId: string) => useQuery(sessionFilesQueryOptions(studioId, sessionId));

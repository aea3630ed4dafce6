import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SessionRow } from '@shared/schemas/session-views';

export const getSession = (studioId: string, sessionId: string) => api.get<SessionRow>(`/api/studios/${studioId}/sessions/${sessionId}`);
export const sessionQueryOptions = (studioId: string, sessionId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'sessions', sessionId], queryFn: () => getSession(studioId, sessionId) });
export const useSession = (studioId: string, sessionId: string) => useQuery(sessionQueryOptions(studioId, sessionId));

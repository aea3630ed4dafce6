import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SessionRow } from '@shared/schemas/session-views';

export const getSessions = (studioId: string) => api.get<{ sessions: SessionRow[] }>(`/api/studios/${studioId}/sessions`).then((r) => r.sessions);
export const sessionsQueryOptions = (studioId: string) => queryOptions({ queryKey: ['studios', studioId, 'sessions'], queryFn: () => getSessions(studioId) });
export const useSessions = (studioId: string) => useQuery(sessionsQueryOptions(studioId));

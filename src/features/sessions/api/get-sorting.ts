import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';

/** How often the sorting view is read again while the worker is still making previews. */
export const PREVIEW_POLL_MS = 2000;

export const getSorting = (studioId: string, sessionId: string) => api.get<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/sorting`);

const anyPending = (v: SortingView | undefined) =>
  !!v && (v.loose.some((f) => f.previewStatus === 'pending') || v.stacks.some((s) => s.frames.some((f) => f.previewStatus === 'pending')));

export const sortingQueryOptions = (studioId: string, sessionId: string) =>
  queryOptions({
    queryKey: ['studios', studioId, 'sessions', sessionId, 'sorting'],
    queryFn: () => getSorting(studioId, sessionId),
    refetchInterval: (query) => (anyPending(query.state.data) ? PREVIEW_POLL_MS : false),
  });

export const useSorting = (studioId: string, sessionId: string) => useQuery(sortingQueryOptions(studioId, sessionId));

import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { StackChecksView } from '@shared/schemas/check-views';

/** How often the checks are read again while they are being worked out. */
export const CHECKS_POLL_MS = 2000;

export const getStackChecks = (studioId: string, stackId: string) => api.get<StackChecksView>(`/api/studios/${studioId}/stacks/${stackId}/checks`);

export const stackChecksQueryOptions = (studioId: string, stackId: string) =>
  queryOptions({
    queryKey: ['studios', studioId, 'stacks', stackId, 'checks'],
    queryFn: () => getStackChecks(studioId, stackId),
    refetchInterval: (query) => (query.state.data && query.state.data.status !== 'current' ? CHECKS_POLL_MS : false),
  });

export const useStackChecks = (studioId: string, stackId: string) => useQuery(stackChecksQueryOptions(studioId, stackId));

import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { MyHandoffRow } from '@shared/schemas/handoff';

const POLL_MS = 3000;

export const getMyHandoffs = (studioId: string) => api.get<{ handoffs: MyHandoffRow[] }>(`/api/studios/${studioId}/handoffs/mine`).then((r) => r.handoffs);

/** Read again while a bundle is being prepared or a merged preview is being made. */
export const myHandoffsQueryOptions = (studioId: string) =>
  queryOptions({
    queryKey: ['studios', studioId, 'handoffs', 'mine'],
    queryFn: () => getMyHandoffs(studioId),
    refetchInterval: (query) =>
      query.state.data?.some((h) => h.bundle.status === 'preparing' || h.mergedResult?.previewStatus === 'pending' || (h.state === 'handed-off' && !h.contactSheetAvailable))
        ? POLL_MS
        : false,
  });

export const useMyHandoffs = (studioId: string) => useQuery(myHandoffsQueryOptions(studioId));

export const stackContactSheetUrl = (studioId: string, stackId: string, version: number) => `/api/studios/${studioId}/stacks/${stackId}/contact-sheet.jpg?v=${version}`;

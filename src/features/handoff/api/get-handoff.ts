import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { HandoffView } from '@shared/schemas/handoff';

/** How often the panel is read again while the merged result's preview is being made. */
const PREVIEW_POLL_MS = 2000;

export const handoffBase = (studioId: string, stackId: string) => `/api/studios/${studioId}/stacks/${stackId}/handoff`;

export const getHandoff = (studioId: string, stackId: string) => api.get<HandoffView>(handoffBase(studioId, stackId));

export const handoffQueryOptions = (studioId: string, stackId: string) =>
  queryOptions({
    queryKey: ['studios', studioId, 'stacks', stackId, 'handoff'],
    queryFn: () => getHandoff(studioId, stackId),
    refetchInterval: (query) => (query.state.data?.mergedResult?.previewStatus === 'pending' ? PREVIEW_POLL_MS : false),
  });

export const useHandoff = (studioId: string, stackId: string) => useQuery(handoffQueryOptions(studioId, stackId));

export const mergedPreviewUrl = (studioId: string, stackId: string, resultId: string, size: 'small' | 'large' = 'large') =>
  `${handoffBase(studioId, stackId)}/merged/preview/${size}?r=${resultId}`;
export const mergedFileUrl = (studioId: string, stackId: string) => `${handoffBase(studioId, stackId)}/merged/file`;
export const memberBundleUrl = (studioId: string, stackId: string) => `${handoffBase(studioId, stackId)}/bundle`;

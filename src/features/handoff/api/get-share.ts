import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SharePageView } from '@shared/schemas/handoff';

const POLL_MS = 3000;

export const shareBase = (token: string) => `/api/share/${encodeURIComponent(token)}`;

export const getShare = (token: string) => api.get<SharePageView>(shareBase(token));

export const shareQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['share', token],
    queryFn: () => getShare(token),
    refetchInterval: (query) => {
      const v = query.state.data;
      return v && v.state === 'handed-off' && (v.bundle.status !== 'ready' || !v.contactSheetAvailable) ? POLL_MS : false;
    },
  });

export const useShare = (token: string) => useQuery(shareQueryOptions(token));

export const shareContactSheetUrl = (token: string) => `${shareBase(token)}/contact-sheet.jpg`;
export const shareBundleUrl = (token: string) => `${shareBase(token)}/bundle`;

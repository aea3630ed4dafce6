import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BundleView } from '@shared/schemas/bundles';

export const getLatestSessionBundle = (studioId: string, sessionId: string) =>
  api.get<{ bundle: BundleView | null }>(`/api/studios/${studioId}/sessions/${sessionId}/bundles/latest`);

export const latestSessionBundleQueryOptions = (studioId: string, sessionId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'sessions', sessionId, 'bundles', 'latest'], queryFn: () => getLatestSessionBundle(studioId, sessionId) });

export const useLatestSessionBundle = (studioId: string, sessionId: string, enabled = true) =>
  useQuery({ ...latestSessionBundleQueryOptions(studioId, sessionId), enabled });

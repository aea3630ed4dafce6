import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BundleView } from '@shared/schemas/bundles';

/** How often a bundle being made is read again for its progress. */
export const BUNDLE_POLL_MS = 1000;

export const getBundle = (studioId: string, bundleId: string) => api.get<BundleView>(`/api/studios/${studioId}/bundles/${bundleId}`);

export const isWorking = (b: BundleView | null | undefined) => !!b && (b.status === 'queued' || b.status === 'running');

export const bundleQueryOptions = (studioId: string, bundleId: string) =>
  queryOptions({
    queryKey: ['studios', studioId, 'bundles', bundleId],
    queryFn: () => getBundle(studioId, bundleId),
    refetchInterval: (query) => (isWorking(query.state.data) ? BUNDLE_POLL_MS : false),
  });

/** Polls while the bundle is queued or being made; `initial` is the state already known. */
export const useBundle = (studioId: string, bundleId: string | null, initial?: BundleView | null) =>
  useQuery({ ...bundleQueryOptions(studioId, bundleId ?? ''), enabled: !!bundleId, initialData: initial ?? undefined });

export const bundleDownloadUrl = (studioId: string, bundleId: string) => `/api/studios/${studioId}/bundles/${bundleId}/download`;

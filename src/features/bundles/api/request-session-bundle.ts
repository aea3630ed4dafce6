import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BundleView } from '@shared/schemas/bundles';
import { bundleQueryOptions } from './get-bundle';
import { latestSessionBundleQueryOptions } from './get-session-bundle';

export const requestSessionBundle = (studioId: string, sessionId: string) => api.post<BundleView>(`/api/studios/${studioId}/sessions/${sessionId}/bundles`);

export function useRequestSessionBundle(studioId: string, sessionId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => requestSessionBundle(studioId, sessionId),
    onSuccess: (bundle) => {
      qc.setQueryData(bundleQueryOptions(studioId, bundle.id).queryKey, bundle);
      qc.setQueryData(latestSessionBundleQueryOptions(studioId, sessionId).queryKey, { bundle });
    },
  });
}

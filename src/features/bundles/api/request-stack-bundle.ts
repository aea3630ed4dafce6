import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { BundleView } from '@shared/schemas/bundles';
import { bundleQueryOptions } from './get-bundle';

export const requestStackBundle = (studioId: string, stackId: string) => api.post<BundleView>(`/api/studios/${studioId}/stacks/${stackId}/bundles`);

/** Asks for the bundle of the stack's current version (the same one if it was asked for already). */
export function useRequestStackBundle(studioId: string, stackId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => requestStackBundle(studioId, stackId),
    onSuccess: (bundle) => {
      qc.setQueryData(bundleQueryOptions(studioId, bundle.id).queryKey, bundle);
      // The stack page shows the latest bundle and the contact sheet the bundle makes.
      qc.invalidateQueries({ queryKey: ['studios', studioId, 'stacks', stackId] });
    },
  });
}

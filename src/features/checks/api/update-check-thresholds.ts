import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CheckThresholds } from '@shared/schemas/checks';
import type { CheckThresholdsView } from '@shared/schemas/check-views';
import { checkThresholdsQueryOptions } from './get-check-thresholds';

/** Replaces the studio's own limits; limits left out go back to the defaults. */
export const updateCheckThresholds = (studioId: string, limits: Partial<CheckThresholds>) =>
  api.put<CheckThresholdsView>(`/api/studios/${studioId}/check-thresholds`, limits);

export function useUpdateCheckThresholds(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (limits: Partial<CheckThresholds>) => updateCheckThresholds(studioId, limits),
    onSuccess: (view) => {
      qc.setQueryData(checkThresholdsQueryOptions(studioId).queryKey, view);
      // every stack is checked again with the new limits
      void qc.invalidateQueries({ predicate: (q) => q.queryKey[0] === 'studios' && q.queryKey[1] === studioId && q.queryKey[4] === 'checks' });
    },
  });
}

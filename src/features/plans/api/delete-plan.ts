import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { plansQueryOptions } from './get-plans';
import { planQueryOptions } from './get-plan';

export const deletePlan = (studioId: string, planId: string) => api.delete<void>(`/api/studios/${studioId}/plans/${planId}`);

export function useDeletePlan(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (planId: string) => deletePlan(studioId, planId),
    onSuccess: (_none, planId) => {
      qc.removeQueries({ queryKey: planQueryOptions(studioId, planId).queryKey });
      qc.invalidateQueries({ queryKey: plansQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

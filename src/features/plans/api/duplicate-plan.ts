import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanView } from '@shared/schemas/plan';
import { plansQueryOptions } from './get-plans';
import { planQueryOptions } from './get-plan';

export const duplicatePlan = (studioId: string, planId: string) => api.post<PlanView>(`/api/studios/${studioId}/plans/${planId}/duplicate`);

export function useDuplicatePlan(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (planId: string) => duplicatePlan(studioId, planId),
    onSuccess: (copy) => {
      qc.setQueryData(planQueryOptions(studioId, copy.id).queryKey, copy);
      qc.invalidateQueries({ queryKey: plansQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

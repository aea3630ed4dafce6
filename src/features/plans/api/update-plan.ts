import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanPatch, PlanView } from '@shared/schemas/plan';
import { plansQueryOptions } from './get-plans';
import { planQueryOptions } from './get-plan';

export const updatePlan = (studioId: string, planId: string, change: PlanPatch) => api.patch<PlanView>(`/api/studios/${studioId}/plans/${planId}`, change);

export function useUpdatePlan(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ planId, change }: { planId: string; change: PlanPatch }) => updatePlan(studioId, planId, change),
    onSuccess: (saved) => {
      qc.setQueryData(planQueryOptions(studioId, saved.id).queryKey, saved);
      qc.invalidateQueries({ queryKey: plansQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

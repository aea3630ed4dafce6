import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanSaveInput, PlanView } from '@shared/schemas/plan';
import { plansQueryOptions } from './get-plans';
import { planQueryOptions } from './get-plan';

export const createPlan = (studioId: string, plan: PlanSaveInput) => api.post<PlanView>(`/api/studios/${studioId}/plans`, plan);

export function useCreatePlan(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (plan: PlanSaveInput) => createPlan(studioId, plan),
    onSuccess: (saved) => {
      qc.setQueryData(planQueryOptions(studioId, saved.id).queryKey, saved);
      qc.invalidateQueries({ queryKey: plansQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

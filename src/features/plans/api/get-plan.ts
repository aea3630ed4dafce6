import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanView } from '@shared/schemas/plan';

export const getPlan = (studioId: string, planId: string) => api.get<PlanView>(`/api/studios/${studioId}/plans/${planId}`);
export const planQueryOptions = (studioId: string, planId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'plans', planId], queryFn: () => getPlan(studioId, planId) });
export const usePlan = (studioId: string, planId: string | undefined) =>
  useQuery({ ...planQueryOptions(studioId, planId ?? ''), enabled: Boolean(planId) });

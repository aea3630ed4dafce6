import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PlanSummary } from '@shared/schemas/plan';

export const getPlans = (studioId: string) => api.get<{ plans: PlanSummary[] }>(`/api/studios/${studioId}/plans`).then((r) => r.plans);
export const plansQueryOptions = (studioId: string) => queryOptions({ queryKey: ['studios', studioId, 'plans'], queryFn: () => getPlans(studioId) });
export const usePlans = (studioId: string) => useQuery(plansQueryOptions(studioId));

import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CheckThresholdsView } from '@shared/schemas/check-views';

export const getCheckThresholds = (studioId: string) => api.get<CheckThresholdsView>(`/api/studios/${studioId}/check-thresholds`);

export const checkThresholdsQueryOptions = (studioId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'check-thresholds'], queryFn: () => getCheckThresholds(studioId) });

export const useCheckThresholds = (studioId: string) => useQuery(checkThresholdsQueryOptions(studioId));

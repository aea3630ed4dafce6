import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Kit } from '@shared/schemas/kit';

export const getKit = (studioId: string) => api.get<Kit>(`/api/studios/${studioId}/kit`);
export const kitQueryOptions = (studioId: string) => queryOptions({ queryKey: ['studios', studioId, 'kit'], queryFn: () => getKit(studioId) });
export const useKit = (studioId: string) => useQuery(kitQueryOptions(studioId));

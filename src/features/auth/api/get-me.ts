import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '@/lib/api-client';
import type { Role } from '@shared/roles';

export interface Me {
  id: string;
  email: string;
  name: string;
  studios: { id: string; name: string; role: Role }[];
  activeStudioId: string | null;
}

/** null when nobody is signed in. */
export async function getMe(): Promise<Me | null> {
  try {
    return await api.get<Me>('/api/auth/me');
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ['auth', 'me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(meQueryOptions());

import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Role } from '@shared/roles';

export interface Member {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  since: string;
}

export const getMembers = (studioId: string) => api.get<{ members: Member[] }>(`/api/studios/${studioId}/members`).then((r) => r.members);
export const membersQueryOptions = (studioId: string) => queryOptions({ queryKey: ['studios', studioId, 'members'], queryFn: () => getMembers(studioId) });
export const useMembers = (studioId: string) => useQuery(membersQueryOptions(studioId));

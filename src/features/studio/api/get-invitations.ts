import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Role } from '@shared/roles';

export interface PendingInvitation {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
}

export const getInvitations = (studioId: string) =>
  api.get<{ invitations: PendingInvitation[] }>(`/api/studios/${studioId}/invitations`).then((r) => r.invitations);
export const invitationsQueryOptions = (studioId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'invitations'], queryFn: () => getInvitations(studioId) });
export const useInvitations = (studioId: string, enabled: boolean) => useQuery({ ...invitationsQueryOptions(studioId), enabled });

import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Role } from '@shared/roles';

export interface InvitationInfo {
  studioName: string;
  email: string;
  role: Role;
  hasAccount: boolean;
  expiresAt: string;
}

export const getInvitation = (token: string) => api.get<InvitationInfo>(`/api/auth/invitations/${encodeURIComponent(token)}`);
export const invitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitation', token], queryFn: () => getInvitation(token), retry: false });
export const useInvitation = (token: string) => useQuery(invitationQueryOptions(token));

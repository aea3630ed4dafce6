import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invitationsQueryOptions } from './get-invitations';

export const revokeInvitation = (studioId: string, invitationId: string) => api.delete<void>(`/api/studios/${studioId}/invitations/${invitationId}`);

export function useRevokeInvitation(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => revokeInvitation(studioId, invitationId),
    onSuccess: () => qc.invalidateQueries({ queryKey: invitationsQueryOptions(studioId).queryKey }),
  });
}

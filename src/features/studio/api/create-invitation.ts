import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Role } from '@shared/roles';
import { invitationsQueryOptions } from './get-invitations';

export const createInvitation = (studioId: string, input: { email: string; role: Role }) =>
  api.post<{ id: string }>(`/api/studios/${studioId}/invitations`, input);

export function useCreateInvitation(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { email: string; role: Role }) => createInvitation(studioId, input),
    onSuccess: () => {
      qc.invalidateQueries({ queryKey: invitationsQueryOptions(studioId).queryKey });
      qc.invalidateQueries({ queryKey: ['studios', studioId, 'caught-mail'] });
    },
  });
}

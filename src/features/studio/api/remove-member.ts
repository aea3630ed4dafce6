import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { membersQueryOptions } from './get-members';

export const removeMember = (studioId: string, memberId: string) => api.delete<void>(`/api/studios/${studioId}/members/${memberId}`);

export function useRemoveMember(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (memberId: string) => removeMember(studioId, memberId),
    onSuccess: () => qc.invalidateQueries({ queryKey: membersQueryOptions(studioId).queryKey }),
  });
}

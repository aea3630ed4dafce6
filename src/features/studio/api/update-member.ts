import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Role } from '@shared/roles';
import { membersQueryOptions, type Member } from './get-members';

export const updateMember = (studioId: string, memberId: string, role: Role) =>
  api.patch<{ members: Member[] }>(`/api/studios/${studioId}/members/${memberId}`, { role });

export function useUpdateMember(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ memberId, role }: { memberId: string; role: Role }) => updateMember(studioId, memberId, role),
    onSuccess: ({ members }) => qc.setQueryData(membersQueryOptions(studioId).queryKey, members),
  });
}

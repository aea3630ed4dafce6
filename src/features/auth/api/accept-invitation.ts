import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryOptions, type Me } from './get-me';

export const acceptInvitation = ({ token, name, password }: { token: string; name?: string; password: string }) =>
  api.post<{ me: Me }>(`/api/auth/invitations/${encodeURIComponent(token)}/accept`, { name, password });

export function useAcceptInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: ({ me }) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}

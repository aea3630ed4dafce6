import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryOptions, type Me } from './get-me';

export const switchStudio = (studioId: string) => api.post<Me>('/api/auth/active-studio', { studioId });

export function useSwitchStudio() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: switchStudio,
    onSuccess: (me) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}

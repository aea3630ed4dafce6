import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryOptions, type Me } from './get-me';

export const createStudio = (name: string) => api.post<Me>('/api/auth/studios', { name });

export function useCreateStudio() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createStudio,
    onSuccess: (me) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, setCsrfToken } from '@/lib/api-client';
import { meQueryOptions } from './get-me';

export const signOut = () => api.post<void>('/api/auth/sign-out');

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      setCsrfToken(null);
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, null);
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SignInInput } from '@shared/schemas/auth';
import { meQueryOptions, type Me } from './get-me';

export const signIn = (input: SignInInput) => api.post<{ me: Me }>('/api/auth/sign-in', input);

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: ({ me }) => {
      qc.clear();
      qc.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}

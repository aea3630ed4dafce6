import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const confirmPasswordReset = ({ token, password }: { token: string; password: string }) =>
  api.post<void>(`/api/auth/password-reset/${encodeURIComponent(token)}`, { password });
export const useConfirmPasswordReset = () => useMutation({ mutationFn: confirmPasswordReset });

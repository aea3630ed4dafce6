import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '@/lib/api-client';
import type { sessionCreateSchema } from '@shared/schemas/sessions';
import type { SessionRow } from '@shared/schemas/session-views';
import { sessionsQueryOptions } from './get-sessions';
import { sessionQueryOptions } from './get-session';

export type SessionCreateInput = z.input<typeof sessionCreateSchema>;

export const createSession = (studioId: string, input: SessionCreateInput) => api.post<SessionRow>(`/api/studios/${studioId}/sessions`, input);

export function useCreateSession(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SessionCreateInput) => createSession(studioId, input),
    onSuccess: (saved) => {
      qc.setQueryData(sessionQueryOptions(studioId, saved.id).queryKey, saved);
      qc.invalidateQueries({ queryKey: sessionsQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { SessionRow } from '@shared/schemas/session-views';
import type { SessionCreateInput } from './create-session';
import { sessionsQueryOptions } from './get-sessions';
import { sessionQueryOptions } from './get-session';

export const updateSession = (studioId: string, sessionId: string, change: Partial<SessionCreateInput>) =>
  api.patch<SessionRow>(`/api/studios/${studioId}/sessions/${sessionId}`, change);

export function useUpdateSession(studioId: string, sessionId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (change: Partial<SessionCreateInput>) => updateSession(studioId, sessionId, change),
    onSuccess: (saved) => {
      qc.setQueryData(sessionQueryOptions(studioId, sessionId).queryKey, saved);
      qc.invalidateQueries({ queryKey: sessionsQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

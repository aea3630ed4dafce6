import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SortingView } from '@shared/schemas/session-views';
import { sortingQueryOptions } from './get-sorting';
import { sessionsQueryOptions } from './get-sessions';
import { sessionQueryOptions } from './get-session';

/** A change to the sorting whose answer is the new sorting view: it replaces the cached one. */
export function useSortingEdit<V>(studioId: string, sessionId: string, send: (vars: V) => Promise<SortingView>) {
  const qc = useQueryClient();
  const sortingKey = sortingQueryOptions(studioId, sessionId).queryKey;
  return useMutation({
    mutationFn: send,
    // A read started before the change (the preview poll) must not land after it with the old arrangement.
    onMutate: () => qc.cancelQueries({ queryKey: sortingKey, exact: true }),
    onSuccess: async (view) => {
      await qc.cancelQueries({ queryKey: sortingKey, exact: true });
      qc.setQueryData(sortingKey, view);
      qc.invalidateQueries({ queryKey: sessionQueryOptions(studioId, sessionId).queryKey, exact: true });
      qc.invalidateQueries({ queryKey: sessionsQueryOptions(studioId).queryKey, exact: true });
    },
  });
}

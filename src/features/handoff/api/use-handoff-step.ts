import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { HandoffView } from '@shared/schemas/handoff';
import { handoffQueryOptions } from './get-handoff';

/**
 * A hand-off step answers with the new panel: it replaces the cached one, and the stack page and
 * the retoucher's list are read again (the stack's state changed).
 */
export function useHandoffStep<TVars, TResult>(studioId: string, stackId: string, run: (vars: TVars) => Promise<TResult>, panelOf: (r: TResult) => HandoffView) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: run,
    onSuccess: (result) => {
      qc.setQueryData(handoffQueryOptions(studioId, stackId).queryKey, panelOf(result));
      void qc.invalidateQueries({ queryKey: ['studios', studioId, 'stacks', stackId], exact: true });
      void qc.invalidateQueries({ queryKey: ['studios', studioId, 'handoffs'] });
    },
  });
}

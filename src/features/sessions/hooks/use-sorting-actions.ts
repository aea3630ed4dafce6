import { useSplitStack } from '../api/split-stack';
import { useMergeWithNext } from '../api/merge-stack';
import { useMoveFrames } from '../api/move-frames';
import { useSetFramesExcluded } from '../api/set-frames-excluded';
import { useUpdateStack } from '../api/update-stack';
import { useSetStackState } from '../api/set-stack-state';
import { useReorderFrames } from '../api/reorder-frames';
import { useRegroupSession } from '../api/regroup-session';
import { useUndoSorting } from '../api/undo-sorting';

/** Every edit of the sorting page, with one pending flag and the error of the latest edit. */
export function useSortingActions(studioId: string, sessionId: string) {
  const split = useSplitStack(studioId, sessionId);
  const merge = useMergeWithNext(studioId, sessionId);
  const move = useMoveFrames(studioId, sessionId);
  const exclude = useSetFramesExcluded(studioId, sessionId);
  const update = useUpdateStack(studioId, sessionId);
  const state = useSetStackState(studioId, sessionId);
  const reorder = useReorderFrames(studioId, sessionId);
  const regroup = useRegroupSession(studioId, sessionId);
  const undo = useUndoSorting(studioId, sessionId);
  const all = [split, merge, move, exclude, update, state, reorder, regroup, undo];
  // The error shown is that of the latest edit only; a later success clears it.
  const latest = [...all].sort((a, b) => b.submittedAt - a.submittedAt)[0];
  return {
    split, merge, move, exclude, update, state, reorder, regroup, undo,
    pending: all.some((m) => m.isPending),
    error: latest?.isError ? latest.error : null,
    clearErrors: () => all.forEach((m) => m.reset()),
  };
}

import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

/** toStackId null: the frames become loose frames. */
export const moveFrames = (studioId: string, sessionId: string, frameIds: string[], toStackId: string | null) =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/frames/move`, { frameIds, toStackId });

export const useMoveFrames = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, ({ frameIds, toStackId }: { frameIds: string[]; toStackId: string | null }) => moveFrames(studioId, sessionId, frameIds, toStackId));

import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

/** A new order for every frame of one stack. */
export const reorderFrames = (studioId: string, sessionId: string, stackId: string, frameIds: string[]) =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/stacks/${stackId}/order`, { frameIds });

export const useReorderFrames = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, ({ stackId, frameIds }: { stackId: string; frameIds: string[] }) => reorderFrames(studioId, sessionId, stackId, frameIds));

import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

/** Frames from `frameId` on become a new stack right after this one. */
export const splitStack = (studioId: string, sessionId: string, stackId: string, frameId: string) =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/stacks/${stackId}/split`, { frameId });

export const useSplitStack = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, ({ stackId, frameId }: { stackId: string; frameId: string }) => splitStack(studioId, sessionId, stackId, frameId));

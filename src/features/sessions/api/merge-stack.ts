import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

export const mergeWithNext = (studioId: string, sessionId: string, stackId: string) =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/stacks/${stackId}/merge-next`);

export const useMergeWithNext = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, (stackId: string) => mergeWithNext(studioId, sessionId, stackId));

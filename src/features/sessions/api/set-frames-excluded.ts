import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

export const setFramesExcluded = (studioId: string, sessionId: string, frameIds: string[], excluded: boolean) =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/frames/exclusion`, { frameIds, excluded });

export const useSetFramesExcluded = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, ({ frameIds, excluded }: { frameIds: string[]; excluded: boolean }) => setFramesExcluded(studioId, sessionId, frameIds, excluded));

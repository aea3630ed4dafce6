import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

export const undoSorting = (studioId: string, sessionId: string) =>
  api.post<{ undone: string; sorting: SortingView }>(`/api/studios/${studioId}/sessions/${sessionId}/undo`).then((r) => r.sorting);

export const useUndoSorting = (studioId: string, sessionId: string) => useSortingEdit(studioId, sessionId, () => undoSorting(studioId, sessionId));

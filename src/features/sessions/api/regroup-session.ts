import { api } from '@/lib/api-client';
import type { GroupingOptionsInput } from '@shared/schemas/sessions';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

/** Runs the automatic grouping again with these options: draft stacks are replaced, ready ones kept. */
export const regroupSession = (studioId: string, sessionId: string, options: GroupingOptionsInput) =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/regroup`, options);

export const useRegroupSession = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, (options: GroupingOptionsInput) => regroupSession(studioId, sessionId, options));

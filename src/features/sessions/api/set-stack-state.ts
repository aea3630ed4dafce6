import { api } from '@/lib/api-client';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

export const setStackState = (studioId: string, sessionId: string, stackId: string, state: 'draft' | 'ready') =>
  api.post<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/stacks/${stackId}/state`, { state });

export const useSetStackState = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, ({ stackId, state }: { stackId: string; state: 'draft' | 'ready' }) => setStackState(studioId, sessionId, stackId, state));

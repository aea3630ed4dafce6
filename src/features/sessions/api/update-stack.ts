import { api } from '@/lib/api-client';
import type { StackPatch } from '@shared/schemas/stack-edits';
import type { SortingView } from '@shared/schemas/session-views';
import { useSortingEdit } from './use-sorting-edit';

/** Rename, or link a plan (planId null unlinks). */
export const updateStack = (studioId: string, sessionId: string, stackId: string, patch: StackPatch) =>
  api.patch<SortingView>(`/api/studios/${studioId}/sessions/${sessionId}/stacks/${stackId}`, patch);

export const useUpdateStack = (studioId: string, sessionId: string) =>
  useSortingEdit(studioId, sessionId, ({ stackId, patch }: { stackId: string; patch: StackPatch }) => updateStack(studioId, sessionId, stackId, patch));

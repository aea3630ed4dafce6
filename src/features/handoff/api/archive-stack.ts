import { api } from '@/lib/api-client';
import type { HandoffView } from '@shared/schemas/handoff';
import { handoffBase } from './get-handoff';
import { useHandoffStep } from './use-handoff-step';

export const archiveStack = (studioId: string, stackId: string) => api.post<HandoffView>(`${handoffBase(studioId, stackId)}/archive`);

export const useArchiveStack = (studioId: string, stackId: string) =>
  useHandoffStep(studioId, stackId, () => archiveStack(studioId, stackId), (v) => v);

import { api } from '@/lib/api-client';
import type { HandoffView } from '@shared/schemas/handoff';
import { handoffBase } from './get-handoff';
import { useHandoffStep } from './use-handoff-step';

export const takeBackStack = (studioId: string, stackId: string) => api.post<HandoffView>(`${handoffBase(studioId, stackId)}/take-back`);

export const useTakeBackStack = (studioId: string, stackId: string) =>
  useHandoffStep(studioId, stackId, () => takeBackStack(studioId, stackId), (v) => v);

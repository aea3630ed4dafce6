import { api } from '@/lib/api-client';
import type { HandOffInput, HandoffView, NewShareLink } from '@shared/schemas/handoff';
import { handoffBase } from './get-handoff';
import { useHandoffStep } from './use-handoff-step';

export interface HandOffResult {
  shareLink: NewShareLink | null;
  handoff: HandoffView;
}

export const handOffStack = (studioId: string, stackId: string, input: HandOffInput) => api.post<HandOffResult>(handoffBase(studioId, stackId), input);

export const useHandOffStack = (studioId: string, stackId: string) =>
  useHandoffStep(studioId, stackId, (input: HandOffInput) => handOffStack(studioId, stackId, input), (r) => r.handoff);

import { api } from '@/lib/api-client';
import type { HandoffView } from '@shared/schemas/handoff';
import { handoffBase } from './get-handoff';
import { useHandoffStep } from './use-handoff-step';

export const revokeShareLink = (studioId: string, stackId: string, linkId: string) =>
  api.delete<HandoffView>(`${handoffBase(studioId, stackId)}/share-links/${linkId}`);

export const useRevokeShareLink = (studioId: string, stackId: string) =>
  useHandoffStep(studioId, stackId, (linkId: string) => revokeShareLink(studioId, stackId, linkId), (v) => v);

import { api } from '@/lib/api-client';
import type { HandoffView, NewShareLink } from '@shared/schemas/handoff';
import { handoffBase } from './get-handoff';
import { useHandoffStep } from './use-handoff-step';

export interface CreatedShareLink {
  shareLink: NewShareLink;
  handoff: HandoffView;
}

export const createShareLink = (studioId: string, stackId: string, expiryDays: number) =>
  api.post<CreatedShareLink>(`${handoffBase(studioId, stackId)}/share-links`, { expiryDays });

export const useCreateShareLink = (studioId: string, stackId: string) =>
  useHandoffStep(studioId, stackId, (expiryDays: number) => createShareLink(studioId, stackId, expiryDays), (r) => r.handoff);

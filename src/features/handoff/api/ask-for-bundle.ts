import { api } from '@/lib/api-client';
import type { BundleAvailability } from '@shared/schemas/handoff';

export interface AskedBundle {
  status: BundleAvailability;
  sizeBytes: number | null;
}

/** Asks for the bundle to be made (a failed one again); the answer says whether it is ready. */
export const askForMemberBundle = (studioId: string, stackId: string) => api.post<AskedBundle>(`/api/studios/${studioId}/stacks/${stackId}/handoff/bundle`);
export const askForShareBundle = (token: string) => api.post<AskedBundle>(`/api/share/${encodeURIComponent(token)}/bundle`);

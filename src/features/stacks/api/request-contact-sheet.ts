import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ContactSheetView } from '@shared/schemas/bundles';
import { stackQueryOptions } from './get-stack';

export const requestContactSheet = (studioId: string, stackId: string) =>
  api.post<ContactSheetView>(`/api/studios/${studioId}/stacks/${stackId}/contact-sheet`);

export function useRequestContactSheet(studioId: string, stackId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => requestContactSheet(studioId, stackId),
    onSuccess: () => qc.invalidateQueries({ queryKey: stackQueryOptions(studioId, stackId).queryKey }),
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { KitKind } from '@shared/kit-presets';
import { kitQueryOptions } from './get-kit';

export const deleteKitItem = (studioId: string, kind: KitKind, id: string) => api.delete<void>(`/api/studios/${studioId}/kit/${kind}/${id}`);

export function useDeleteKitItem(studioId: string, kind: KitKind) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => deleteKitItem(studioId, kind, id),
    onSuccess: () => qc.invalidateQueries({ queryKey: kitQueryOptions(studioId).queryKey }),
  });
}

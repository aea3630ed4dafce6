import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { KitKind } from '@shared/kit-presets';
import type { KitInputs, KitItems } from '@shared/schemas/kit';
import { kitQueryOptions } from './get-kit';

export const updateKitItem = <K extends KitKind>(studioId: string, kind: K, id: string, change: Partial<KitInputs[K]>) =>
  api.patch<KitItems[K]>(`/api/studios/${studioId}/kit/${kind}/${id}`, change);

export function useUpdateKitItem<K extends KitKind>(studioId: string, kind: K) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, change }: { id: string; change: Partial<KitInputs[K]> }) => updateKitItem(studioId, kind, id, change),
    onSuccess: () => qc.invalidateQueries({ queryKey: kitQueryOptions(studioId).queryKey }),
  });
}

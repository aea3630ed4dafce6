import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { KitKind } from '@shared/kit-presets';
import type { KitInputs, KitItems } from '@shared/schemas/kit';
import { kitQueryOptions } from './get-kit';

export const createKitItem = <K extends KitKind>(studioId: string, kind: K, input: KitInputs[K]) =>
  api.post<KitItems[K]>(`/api/studios/${studioId}/kit/${kind}`, input);

export function useCreateKitItem<K extends KitKind>(studioId: string, kind: K) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: KitInputs[K]) => createKitItem(studioId, kind, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: kitQueryOptions(studioId).queryKey }),
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateKitRequest, KitDetail } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

/** POST /api/kits: re-plans and reserves the parts in one transaction. */
export function createKit(body: CreateKitRequest): Promise<KitDetail> {
  return apiClient.post<KitDetail>('/api/kits', { ...body });
}

export function useCreateKit() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createKit,
    onSuccess: (kit) => {
      qc.setQueryData(kitKeys.detail(kit.id), kit);
      void qc.invalidateQueries({ queryKey: kitKeys.lists() });
      void qc.invalidateQueries({ queryKey: kitKeys.stock() });
      void qc.invalidateQueries({ queryKey: kitKeys.ofLots() });
    },
  });
}

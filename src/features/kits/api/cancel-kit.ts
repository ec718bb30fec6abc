import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CancelKitRequest, KitDetail } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

export function cancelKit({ id, body }: { id: number; body: CancelKitRequest }): Promise<KitDetail> {
  return apiClient.post<KitDetail>(`/api/kits/${id}/cancel`, { ...body });
}

export function useCancelKit() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: cancelKit,
    onSuccess: (kit) => {
      qc.setQueryData(kitKeys.detail(kit.id), kit);
      void qc.invalidateQueries({ queryKey: kitKeys.lists() });
      void qc.invalidateQueries({ queryKey: kitKeys.stock() });
      void qc.invalidateQueries({ queryKey: kitKeys.ofLots() });
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LotDetail } from '../../../../shared/api/lots.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { lotKeys } from './keys.ts';

export function openDryBag({ id, openedAt }: { id: number; openedAt?: string }): Promise<LotDetail> {
  return apiClient.patch<LotDetail>(`/api/lots/${id}/dry-bag`, { state: 'opened', ...(openedAt ? { openedAt } : {}) });
}

export function useOpenDryBag() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: openDryBag,
    onSuccess: (lot) => {
      qc.setQueryData(lotKeys.detail(lot.id), lot);
      return qc.invalidateQueries({ queryKey: lotKeys.lists() });
    },
  });
}

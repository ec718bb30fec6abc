import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateLotRequest, LotDetail } from '../../../../shared/api/lots.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { lotKeys } from './keys.ts';

export function createLot(body: CreateLotRequest): Promise<LotDetail> {
  return apiClient.post<LotDetail>('/api/lots', { ...body });
}

export function useCreateLot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createLot,
    onSuccess: (lot) => {
      qc.setQueryData(lotKeys.detail(lot.id), lot);
      return qc.invalidateQueries({ queryKey: lotKeys.lists() });
    },
  });
}

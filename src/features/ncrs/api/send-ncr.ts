import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { ncrKeys } from './keys.ts';

export function sendNcr(id: number): Promise<NcrDetail> {
  return apiClient.post(`/api/ncrs/${id}/send`);
}

export function useSendNcr() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: sendNcr,
    onSuccess: (ncr) => {
      qc.setQueryData(ncrKeys.detail(ncr.id), ncr);
      void qc.invalidateQueries({ queryKey: ncrKeys.lists() });
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { ncrKeys } from './keys.ts';

export function closeNcr({ id, note }: { id: number; note: string | null }): Promise<NcrDetail> {
  return apiClient.post(`/api/ncrs/${id}/close`, { note });
}

export function useCloseNcr() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: closeNcr,
    onSuccess: (ncr) => {
      qc.setQueryData(ncrKeys.detail(ncr.id), ncr);
      void qc.invalidateQueries({ queryKey: ncrKeys.lists() });
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateNcrRequest, NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { ncrKeys } from './keys.ts';

export function createNcr(body: CreateNcrRequest): Promise<NcrDetail> {
  return apiClient.post('/api/ncrs', { ...body });
}

export function useCreateNcr() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createNcr,
    onSuccess: (ncr) => {
      qc.setQueryData(ncrKeys.detail(ncr.id), ncr);
      // Alerts list the NCRs raised from them.
      void qc.invalidateQueries();
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DispositionView, ProposeDispositionRequest } from '../../../../shared/api/disposition.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { dispositionKeys } from './keys.ts';

export function proposeDisposition(lotId: number, body: ProposeDispositionRequest): Promise<DispositionView> {
  return apiClient.post<DispositionView>(`/api/lots/${lotId}/disposition`, { ...body });
}

export function useProposeDisposition(lotId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ProposeDispositionRequest) => proposeDisposition(lotId, body),
    onSuccess: (view) => qc.setQueryData(dispositionKeys.lot(lotId), view),
  });
}

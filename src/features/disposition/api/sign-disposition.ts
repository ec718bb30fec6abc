import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DispositionView, SignDispositionRequest } from '../../../../shared/api/disposition.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { dispositionKeys } from './keys.ts';

export function signDisposition(lotId: number, body: SignDispositionRequest): Promise<DispositionView> {
  return apiClient.post<DispositionView>(`/api/lots/${lotId}/disposition/sign`, { ...body });
}

export function useSignDisposition(lotId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SignDispositionRequest) => signDisposition(lotId, body),
    onSuccess: (view) => qc.setQueryData(dispositionKeys.lot(lotId), view),
  });
}

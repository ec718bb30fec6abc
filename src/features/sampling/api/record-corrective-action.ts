import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SwitchingView } from '../../../../shared/api/sampling.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { samplingKeys } from './keys.ts';

export function recordCorrectiveAction(input: { supplierId: number; partTypeId: number; note: string }): Promise<SwitchingView> {
  return apiClient.post<SwitchingView>(`/api/switching/${input.supplierId}/${input.partTypeId}`, { note: input.note });
}

export function useRecordCorrectiveAction() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: recordCorrectiveAction, onSuccess: () => qc.invalidateQueries({ queryKey: samplingKeys.all }) });
}

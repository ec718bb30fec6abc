import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function deletePartMapping({ supplierId, mappingId }: { supplierId: number; mappingId: number }): Promise<void> {
  return apiClient.delete<void>(`/api/suppliers/${supplierId}/parts/${mappingId}`);
}

export function useDeletePartMapping(supplierId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (mappingId: number) => deletePartMapping({ supplierId, mappingId }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: supplierKeys.all }),
  });
}

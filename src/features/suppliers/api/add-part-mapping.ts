import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SupplierPartInput, SupplierPartRow } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function addPartMapping({ supplierId, ...body }: SupplierPartInput & { supplierId: number }): Promise<SupplierPartRow> {
  return apiClient.post<SupplierPartRow>(`/api/suppliers/${supplierId}/parts`, { ...body });
}

export function useAddPartMapping(supplierId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SupplierPartInput) => addPartMapping({ supplierId, ...body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: supplierKeys.all }),
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SupplierDetail, SupplierUpdate } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function updateSupplier({ id, ...body }: SupplierUpdate & { id: number }): Promise<SupplierDetail> {
  return apiClient.patch<SupplierDetail>(`/api/suppliers/${id}`, { ...body });
}

export function useUpdateSupplier() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateSupplier,
    onSuccess: (detail) => {
      qc.setQueryData(supplierKeys.detail(detail.id), detail);
      void qc.invalidateQueries({ queryKey: supplierKeys.lists() });
    },
  });
}

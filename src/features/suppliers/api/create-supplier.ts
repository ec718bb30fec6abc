import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SupplierDetail, SupplierInput } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function createSupplier(body: SupplierInput): Promise<SupplierDetail> {
  return apiClient.post<SupplierDetail>('/api/suppliers', { ...body });
}

export function useCreateSupplier() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createSupplier, onSuccess: () => qc.invalidateQueries({ queryKey: supplierKeys.lists() }) });
}

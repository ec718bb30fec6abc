import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SupplierDetail } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { supplierKeys } from './keys.ts';

export function getSupplier(id: number): Promise<SupplierDetail> {
  return apiClient.get<SupplierDetail>(`/api/suppliers/${id}`);
}

export const supplierQueryOptions = (id: number) => queryOptions({ queryKey: supplierKeys.detail(id), queryFn: () => getSupplier(id) });

export function useSupplier(id: number) {
  return useQuery(supplierQueryOptions(id));
}

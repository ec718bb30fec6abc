import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SupplierRow } from '../../../../shared/api/catalog.ts';
import type { Page } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { supplierKeys, type SupplierFilters } from './keys.ts';

export function getSuppliers(f: SupplierFilters): Promise<Page<SupplierRow>> {
  return apiClient.get<Page<SupplierRow>>(`/api/suppliers${qs({ ...f })}`);
}

export const suppliersQueryOptions = (f: SupplierFilters) =>
  queryOptions({ queryKey: supplierKeys.list(f), queryFn: () => getSuppliers(f), placeholderData: keepPreviousData });

export function useSuppliers(f: SupplierFilters) {
  return useQuery(suppliersQueryOptions(f));
}

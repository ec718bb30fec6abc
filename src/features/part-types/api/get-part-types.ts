import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { PartTypeRow } from '../../../../shared/api/catalog.ts';
import type { Page } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { partTypeKeys, type PartTypeFilters } from './keys.ts';

export function getPartTypes(f: PartTypeFilters): Promise<Page<PartTypeRow>> {
  return apiClient.get<Page<PartTypeRow>>(`/api/part-types${qs({ ...f })}`);
}

export const partTypesQueryOptions = (f: PartTypeFilters) =>
  queryOptions({ queryKey: partTypeKeys.list(f), queryFn: () => getPartTypes(f), placeholderData: keepPreviousData });

export function usePartTypes(f: PartTypeFilters) {
  return useQuery(partTypesQueryOptions(f));
}

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BinSchemeVersionRow } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function getBinSchemes(partTypeId: number): Promise<BinSchemeVersionRow[]> {
  return apiClient.get<BinSchemeVersionRow[]>(`/api/part-types/${partTypeId}/bin-schemes`);
}

export const binSchemesQueryOptions = (partTypeId: number) =>
  queryOptions({ queryKey: partTypeKeys.schemes(partTypeId), queryFn: () => getBinSchemes(partTypeId) });

export function useBinSchemes(partTypeId: number) {
  return useQuery(binSchemesQueryOptions(partTypeId));
}

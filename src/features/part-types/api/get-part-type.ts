import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PartTypeDetail } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function getPartType(id: number): Promise<PartTypeDetail> {
  return apiClient.get<PartTypeDetail>(`/api/part-types/${id}`);
}

export const partTypeQueryOptions = (id: number) => queryOptions({ queryKey: partTypeKeys.detail(id), queryFn: () => getPartType(id) });

export function usePartType(id: number) {
  return useQuery(partTypeQueryOptions(id));
}

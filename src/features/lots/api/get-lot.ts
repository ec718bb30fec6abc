import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LotDetail } from '../../../../shared/api/lots.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { lotKeys } from './keys.ts';

export function getLot(id: number): Promise<LotDetail> {
  return apiClient.get<LotDetail>(`/api/lots/${id}`);
}

export const lotQueryOptions = (id: number) => queryOptions({ queryKey: lotKeys.detail(id), queryFn: () => getLot(id) });

export function useLot(id: number) {
  return useQuery(lotQueryOptions(id));
}

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { StockResponse } from '../../../../shared/api/bins.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

export function getStock(partTypeId?: number): Promise<StockResponse> {
  return apiClient.get<StockResponse>(`/api/stock${qs({ partTypeId })}`);
}

export const stockQueryOptions = (partTypeId?: number) => queryOptions({ queryKey: binKeys.stock(partTypeId), queryFn: () => getStock(partTypeId) });

export function useStock(partTypeId?: number) {
  return useQuery(stockQueryOptions(partTypeId));
}

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LotFilters, LotRow } from '../../../../shared/api/lots.ts';
import type { Page } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { lotKeys } from './keys.ts';

export function getLots(f: LotFilters): Promise<Page<LotRow>> {
  return apiClient.get<Page<LotRow>>(`/api/lots${qs({ ...f })}`);
}

export const lotsQueryOptions = (f: LotFilters) =>
  queryOptions({ queryKey: lotKeys.list(f), queryFn: () => getLots(f), placeholderData: keepPreviousData });

export function useLots(f: LotFilters) {
  return useQuery(lotsQueryOptions(f));
}

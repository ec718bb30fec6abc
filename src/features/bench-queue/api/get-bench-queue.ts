import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { BenchQueueRow } from '../../../../shared/api/bench.ts';
import type { Page } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { benchQueueKeys, type BenchQueueFilters } from './keys.ts';

export function getBenchQueue(f: BenchQueueFilters): Promise<Page<BenchQueueRow>> {
  return apiClient.get<Page<BenchQueueRow>>(`/api/bench/queue${qs({ ...f })}`);
}

export const benchQueueQueryOptions = (f: BenchQueueFilters) =>
  queryOptions({ queryKey: benchQueueKeys.list(f), queryFn: () => getBenchQueue(f), placeholderData: keepPreviousData });

export function useBenchQueue(f: BenchQueueFilters) {
  return useQuery(benchQueueQueryOptions(f));
}

import type { BenchQueueSort } from '../../../../shared/api/bench.ts';

export interface BenchQueueFilters {
  page: number;
  pageSize: number;
  status: string;
  search?: string;
  sort?: BenchQueueSort;
  dir?: 'asc' | 'desc';
}

export const benchQueueKeys = {
  all: ['bench-queue'] as const,
  list: (f: BenchQueueFilters) => [...benchQueueKeys.all, f] as const,
};

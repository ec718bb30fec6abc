import type { ScorecardPeriod, ScorecardSort } from '../../../../shared/api/supplier-quality.ts';

export interface ScorecardFilters extends ScorecardPeriod {
  page: number;
  pageSize: number;
  search?: string;
  sort?: ScorecardSort;
  dir?: 'asc' | 'desc';
}

export const scorecardKeys = {
  all: ['scorecards'] as const,
  lists: () => [...scorecardKeys.all, 'list'] as const,
  list: (f: ScorecardFilters) => [...scorecardKeys.lists(), f] as const,
  detail: (supplierId: number, period: ScorecardPeriod) => [...scorecardKeys.all, 'detail', supplierId, period] as const,
};

import type { LotFilters } from '../../../../shared/api/lots.ts';

export const lotKeys = {
  all: ['lots'] as const,
  lists: () => [...lotKeys.all, 'list'] as const,
  list: (filters: LotFilters) => [...lotKeys.lists(), filters] as const,
  details: () => [...lotKeys.all, 'detail'] as const,
  detail: (id: number) => [...lotKeys.details(), id] as const,
  receivingOptions: () => [...lotKeys.all, 'receiving-options'] as const,
};

import type { NcrSort, NcrStatus } from '../../../../shared/api/supplier-quality.ts';

export interface NcrFilters {
  page: number;
  pageSize: number;
  status?: NcrStatus;
  supplierId?: number;
  sort?: NcrSort;
  dir?: 'asc' | 'desc';
}

export const ncrKeys = {
  all: ['ncrs'] as const,
  lists: () => [...ncrKeys.all, 'list'] as const,
  list: (f: NcrFilters) => [...ncrKeys.lists(), f] as const,
  detail: (id: number) => [...ncrKeys.all, 'detail', id] as const,
  draft: (lotId: number, alertId: number | null) => [...ncrKeys.all, 'draft', lotId, alertId] as const,
};

import type { PartTypeListQuery } from '../../../../shared/api/catalog.ts';

export type PartTypeFilters = PartTypeListQuery;

export const partTypeKeys = {
  all: ['part-types'] as const,
  lists: () => [...partTypeKeys.all, 'list'] as const,
  list: (filters: PartTypeFilters) => [...partTypeKeys.lists(), filters] as const,
  packages: () => [...partTypeKeys.all, 'packages'] as const,
  details: () => [...partTypeKeys.all, 'detail'] as const,
  detail: (id: number) => [...partTypeKeys.details(), id] as const,
  schemes: (id: number) => [...partTypeKeys.detail(id), 'bin-schemes'] as const,
};

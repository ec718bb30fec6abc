import type { KitFilters } from '../../../../shared/api/pairing.ts';

export const kitKeys = {
  all: ['kits'] as const,
  lists: () => [...kitKeys.all, 'list'] as const,
  list: (filters: KitFilters) => [...kitKeys.lists(), filters] as const,
  detail: (id: number) => [...kitKeys.all, 'detail', id] as const,
  stock: () => [...kitKeys.all, 'stock'] as const,
  /** The kits holding parts of a lot (GET /api/lots/:id/kits); reserve, pull and cancel change them. */
  ofLots: () => [...kitKeys.all, 'of-lot'] as const,
  ofLot: (lotId: number) => [...kitKeys.ofLots(), lotId] as const,
};

import type { ContainerFilters } from '../../../../shared/api/bins.ts';

export const binKeys = {
  all: ['bins'] as const,
  containers: () => [...binKeys.all, 'containers'] as const,
  containerList: (filters: ContainerFilters) => [...binKeys.containers(), 'list', filters] as const,
  container: (id: number) => [...binKeys.containers(), 'detail', id] as const,
  containerByCode: (code: string) => [...binKeys.containers(), 'code', code.toUpperCase()] as const,
  stock: (partTypeId?: number) => [...binKeys.all, 'stock', partTypeId ?? 'all'] as const,
  lot: (lotId: number) => [...binKeys.all, 'lot', lotId] as const,
  screening: (lotId: number) => [...binKeys.lot(lotId), 'screening'] as const,
  recent: (lotId: number) => [...binKeys.lot(lotId), 'recent'] as const,
};

import type { AlertStatus } from '../../../../shared/api/supplier-quality.ts';

export interface AlertFilters {
  page: number;
  status?: AlertStatus;
  supplierId?: number;
}

export const alertKeys = {
  all: ['drift-alerts'] as const,
  list: (f: AlertFilters) => [...alertKeys.all, 'list', f] as const,
};

import type { MeasurementSort } from '../../../../shared/api/measurements.ts';

export interface MeasurementFilters {
  page: number;
  pageSize: number;
  sort: MeasurementSort;
  dir: 'asc' | 'desc';
  history: boolean;
  flagged: boolean;
}

export const measurementKeys = {
  all: ['measurements'] as const,
  lot: (lotId: number) => [...measurementKeys.all, 'lot', lotId] as const,
  sessions: (lotId: number) => [...measurementKeys.lot(lotId), 'sessions'] as const,
  list: (lotId: number, f: MeasurementFilters) => [...measurementKeys.lot(lotId), 'list', f] as const,
  mapping: (instrument: string) => [...measurementKeys.all, 'mapping', instrument] as const,
};

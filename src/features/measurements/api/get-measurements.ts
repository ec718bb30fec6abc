import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MeasurementRow } from '../../../../shared/api/measurements.ts';
import type { Page } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { measurementKeys, type MeasurementFilters } from './keys.ts';

export function getMeasurements(lotId: number, f: MeasurementFilters): Promise<Page<MeasurementRow>> {
  return apiClient.get<Page<MeasurementRow>>(`/api/lots/${lotId}/measurements${qs({ ...f, history: f.history || undefined, flagged: f.flagged || undefined })}`);
}

export const measurementsQueryOptions = (lotId: number, f: MeasurementFilters) =>
  queryOptions({ queryKey: measurementKeys.list(lotId, f), queryFn: () => getMeasurements(lotId, f), placeholderData: keepPreviousData });

export function useMeasurements(lotId: number, f: MeasurementFilters) {
  return useQuery(measurementsQueryOptions(lotId, f));
}

import { useMutation } from '@tanstack/react-query';
import type { MeasurementRow, RecordMeasurementRequest } from '../../../../shared/api/measurements.ts';
import { apiClient } from '../../../lib/api-client.ts';

export function recordMeasurement(lotId: number, body: RecordMeasurementRequest): Promise<MeasurementRow> {
  return apiClient.post<MeasurementRow>(`/api/lots/${lotId}/measurements`, { ...body });
}

/** The caller refreshes the lot's other views (plan, summary…) through onSuccess. */
export function useRecordMeasurement(lotId: number) {
  return useMutation({ mutationFn: (body: RecordMeasurementRequest) => recordMeasurement(lotId, body) });
}

import { useMutation } from '@tanstack/react-query';
import type { CorrectMeasurementRequest, MeasurementRow } from '../../../../shared/api/measurements.ts';
import { apiClient } from '../../../lib/api-client.ts';

export function correctMeasurement(lotId: number, measurementId: string, body: CorrectMeasurementRequest): Promise<MeasurementRow> {
  return apiClient.post<MeasurementRow>(`/api/lots/${lotId}/measurements/${measurementId}/corrections`, { ...body });
}

export function useCorrectMeasurement(lotId: number) {
  return useMutation({ mutationFn: (v: { measurementId: string; body: CorrectMeasurementRequest }) => correctMeasurement(lotId, v.measurementId, v.body) });
}

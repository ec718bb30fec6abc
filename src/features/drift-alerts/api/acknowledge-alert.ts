import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DriftAlertRow } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { alertKeys } from './keys.ts';

export function acknowledgeAlert({ id, note }: { id: number; note: string }): Promise<DriftAlertRow> {
  return apiClient.post(`/api/drift-alerts/${id}/acknowledge`, { note });
}

export function useAcknowledgeAlert() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: acknowledgeAlert, onSuccess: () => qc.invalidateQueries({ queryKey: alertKeys.all }) });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionRow } from '../../../../shared/api/measurements.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { measurementKeys } from './keys.ts';

export function closeSession(lotId: number, sessionId: number): Promise<SessionRow> {
  return apiClient.post<SessionRow>(`/api/lots/${lotId}/sessions/${sessionId}/close`, {});
}

export function useCloseSession(lotId: number) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (sessionId: number) => closeSession(lotId, sessionId), onSuccess: () => qc.invalidateQueries({ queryKey: measurementKeys.sessions(lotId) }) });
}

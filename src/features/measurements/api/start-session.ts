import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionRow, StartSessionRequest } from '../../../../shared/api/measurements.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { measurementKeys } from './keys.ts';

export function startSession(input: StartSessionRequest & { lotId: number }): Promise<SessionRow> {
  const { lotId, ...body } = input;
  return apiClient.post<SessionRow>(`/api/lots/${lotId}/sessions`, { ...body });
}

export function useStartSession(lotId: number) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: StartSessionRequest) => startSession({ ...body, lotId }), onSuccess: () => qc.invalidateQueries({ queryKey: measurementKeys.sessions(lotId) }) });
}

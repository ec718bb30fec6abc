import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionsResponse } from '../../../../shared/api/measurements.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { measurementKeys } from './keys.ts';

export function getSessions(lotId: number): Promise<SessionsResponse> {
  return apiClient.get<SessionsResponse>(`/api/lots/${lotId}/sessions`);
}

export const sessionsQueryOptions = (lotId: number) => queryOptions({ queryKey: measurementKeys.sessions(lotId), queryFn: () => getSessions(lotId) });

export function useSessions(lotId: number) {
  return useQuery(sessionsQueryOptions(lotId));
}

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LotScreening, RecentPlacementsResponse } from '../../../../shared/api/bins.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

export function getLotScreening(lotId: number): Promise<LotScreening> {
  return apiClient.get<LotScreening>(`/api/lots/${lotId}/screening`);
}

export const lotScreeningQueryOptions = (lotId: number) => queryOptions({ queryKey: binKeys.screening(lotId), queryFn: () => getLotScreening(lotId) });

export function useLotScreening(lotId: number) {
  return useQuery(lotScreeningQueryOptions(lotId));
}

export function getRecentPlacements(lotId: number, limit = 3): Promise<RecentPlacementsResponse> {
  return apiClient.get<RecentPlacementsResponse>(`/api/lots/${lotId}/screening/recent?limit=${limit}`);
}

export const recentPlacementsQueryOptions = (lotId: number) => queryOptions({ queryKey: binKeys.recent(lotId), queryFn: () => getRecentPlacements(lotId) });

export function useRecentPlacements(lotId: number) {
  return useQuery(recentPlacementsQueryOptions(lotId));
}

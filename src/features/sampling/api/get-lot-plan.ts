import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LotPlanResponse } from '../../../../shared/api/sampling.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { samplingKeys } from './keys.ts';

export function getLotPlan(lotId: number): Promise<LotPlanResponse> {
  return apiClient.get<LotPlanResponse>(`/api/lots/${lotId}/plan`);
}

export const lotPlanQueryOptions = (lotId: number) => queryOptions({ queryKey: samplingKeys.lotPlan(lotId), queryFn: () => getLotPlan(lotId) });

export function useLotPlan(lotId: number) {
  return useQuery(lotPlanQueryOptions(lotId));
}

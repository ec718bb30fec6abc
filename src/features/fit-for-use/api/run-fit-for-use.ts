import { useMutation } from '@tanstack/react-query';
import type { FitForUseRequest, FitForUseResponse } from '../../../../shared/api/bias.ts';
import { apiClient } from '../../../lib/api-client.ts';

/** POST /api/bias/fit-for-use: the stage run against every measured part of a lot or part type. */
export function runFitForUse(body: FitForUseRequest): Promise<FitForUseResponse> {
  return apiClient.post<FitForUseResponse>('/api/bias/fit-for-use', { ...body });
}

export function useRunFitForUse() {
  return useMutation({ mutationFn: runFitForUse });
}

import { useMutation } from '@tanstack/react-query';
import type { KitPlan, KitPlanRequest } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';

/** POST /api/kits/plan: what the request would reserve now; nothing changes. */
export function planKit(body: KitPlanRequest): Promise<KitPlan> {
  return apiClient.post<KitPlan>('/api/kits/plan', { ...body });
}

export function usePlanKit() {
  return useMutation({ mutationFn: planKit });
}

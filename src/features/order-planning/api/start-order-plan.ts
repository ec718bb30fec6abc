import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { OrderPlanJob, OrderPlanRequest } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { orderPlanKeys } from './keys.ts';

export function startOrderPlan(body: OrderPlanRequest): Promise<OrderPlanJob> {
  return apiClient.post('/api/order-plans', { ...body });
}

export function useStartOrderPlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: startOrderPlan, onSuccess: (job) => qc.setQueryData(orderPlanKeys.detail(job.id), job) });
}

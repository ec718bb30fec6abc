import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OrderPlanJob } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { orderPlanKeys } from './keys.ts';

export function getOrderPlan(id: string): Promise<OrderPlanJob> {
  return apiClient.get(`/api/order-plans/${id}`);
}

/** Polls every 300 ms while the simulation runs. */
export const orderPlanQueryOptions = (id: string) =>
  queryOptions({ queryKey: orderPlanKeys.detail(id), queryFn: () => getOrderPlan(id), refetchInterval: (q) => (q.state.data?.status === 'running' ? 300 : false) });

export function useOrderPlan(id: string | null) {
  return useQuery({ ...orderPlanQueryOptions(id ?? ''), enabled: id !== null });
}

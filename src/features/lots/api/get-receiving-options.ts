import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReceivingOptions } from '../../../../shared/api/lots.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { lotKeys } from './keys.ts';

export function getReceivingOptions(): Promise<ReceivingOptions> {
  return apiClient.get<ReceivingOptions>('/api/lots/receiving-options');
}

export const receivingOptionsQueryOptions = () =>
  queryOptions({ queryKey: lotKeys.receivingOptions(), queryFn: getReceivingOptions, staleTime: 60_000 });

export function useReceivingOptions() {
  return useQuery(receivingOptionsQueryOptions());
}

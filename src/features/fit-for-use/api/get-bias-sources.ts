import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BiasSourcePartType } from '../../../../shared/api/bias.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { biasKeys } from './keys.ts';

export function getBiasSources(): Promise<BiasSourcePartType[]> {
  return apiClient.get<BiasSourcePartType[]>('/api/bias/sources');
}

export const biasSourcesQueryOptions = () => queryOptions({ queryKey: biasKeys.sources(), queryFn: getBiasSources });

export function useBiasSources() {
  return useQuery(biasSourcesQueryOptions());
}

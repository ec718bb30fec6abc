import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function getPackages(): Promise<string[]> {
  return apiClient.get<string[]>('/api/part-types/packages');
}

export const packagesQueryOptions = () => queryOptions({ queryKey: partTypeKeys.packages(), queryFn: getPackages, staleTime: 60_000 });

export function usePackages() {
  return useQuery(packagesQueryOptions());
}

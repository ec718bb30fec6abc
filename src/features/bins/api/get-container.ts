import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ContainerDetail } from '../../../../shared/api/bins.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

export function getContainer(id: number): Promise<ContainerDetail> {
  return apiClient.get<ContainerDetail>(`/api/containers/${id}`);
}

export const containerQueryOptions = (id: number) => queryOptions({ queryKey: binKeys.container(id), queryFn: () => getContainer(id) });

export function useContainer(id: number) {
  return useQuery({ ...containerQueryOptions(id), enabled: Number.isSafeInteger(id) && id > 0 });
}

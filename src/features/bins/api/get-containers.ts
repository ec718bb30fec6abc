import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ContainerFilters, ContainerRow } from '../../../../shared/api/bins.ts';
import type { Page } from '../../../../shared/api/page.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

export function getContainers(f: ContainerFilters): Promise<Page<ContainerRow>> {
  return apiClient.get<Page<ContainerRow>>(`/api/containers${qs({ ...f })}`);
}

export const containersQueryOptions = (f: ContainerFilters) =>
  queryOptions({ queryKey: binKeys.containerList(f), queryFn: () => getContainers(f), placeholderData: keepPreviousData });

export function useContainers(f: ContainerFilters) {
  return useQuery(containersQueryOptions(f));
}

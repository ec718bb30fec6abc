import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ContainerDetail } from '../../../../shared/api/bins.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

/** The container a scanned or typed code names. */
export function getContainerByCode(code: string): Promise<ContainerDetail> {
  return apiClient.get<ContainerDetail>(`/api/containers/by-code/${encodeURIComponent(code.trim())}`);
}

export const containerByCodeQueryOptions = (code: string) =>
  queryOptions({ queryKey: binKeys.containerByCode(code), queryFn: () => getContainerByCode(code), retry: false });

export function useContainerByCode(code: string) {
  return useQuery({ ...containerByCodeQueryOptions(code), enabled: code.trim() !== '' });
}

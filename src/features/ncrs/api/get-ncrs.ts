import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '../../../../shared/api/page.ts';
import type { NcrRow } from '../../../../shared/api/supplier-quality.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { ncrKeys, type NcrFilters } from './keys.ts';

export function getNcrs(f: NcrFilters): Promise<Page<NcrRow>> {
  return apiClient.get(`/api/ncrs${qs({ ...f })}`);
}

export const ncrsQueryOptions = (f: NcrFilters) => queryOptions({ queryKey: ncrKeys.list(f), queryFn: () => getNcrs(f), placeholderData: keepPreviousData });

export function useNcrs(f: NcrFilters) {
  return useQuery(ncrsQueryOptions(f));
}

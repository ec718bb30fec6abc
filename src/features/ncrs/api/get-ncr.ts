import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { ncrKeys } from './keys.ts';

export function getNcr(id: number): Promise<NcrDetail> {
  return apiClient.get(`/api/ncrs/${id}`);
}

/** While a message waits or has failed, poll so the page shows when it goes out. */
export const ncrQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ncrKeys.detail(id),
    queryFn: () => getNcr(id),
    refetchInterval: (q) => (q.state.data?.mail && q.state.data.mail.status !== 'sent' ? 5000 : false),
  });

export function useNcr(id: number) {
  return useQuery({ ...ncrQueryOptions(id), enabled: Number.isInteger(id) && id > 0 });
}

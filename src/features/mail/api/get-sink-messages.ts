import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SinkMessage } from '../../../../shared/api/mail.ts';
import type { Page } from '../../../../shared/api/page.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { mailKeys } from './keys.ts';

export const SINK_PAGE_SIZE = 10;

export function getSinkMessages(page: number): Promise<Page<SinkMessage>> {
  return apiClient.get(`/api/mail/sink${qs({ page, pageSize: SINK_PAGE_SIZE })}`);
}

export const sinkQueryOptions = (page: number) =>
  queryOptions({ queryKey: mailKeys.sink(page), queryFn: () => getSinkMessages(page), placeholderData: keepPreviousData });

export function useSinkMessages(page: number) {
  return useQuery(sinkQueryOptions(page));
}

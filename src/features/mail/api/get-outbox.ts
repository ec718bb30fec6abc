import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxRow } from '../../../../shared/api/mail.ts';
import type { Page } from '../../../../shared/api/page.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { mailKeys } from './keys.ts';

export const OUTBOX_PAGE_SIZE = 20;

export function getOutbox(f: { page: number; status?: string }): Promise<Page<OutboxRow>> {
  return apiClient.get(`/api/mail/outbox${qs({ page: f.page, pageSize: OUTBOX_PAGE_SIZE, status: f.status })}`);
}

export const outboxQueryOptions = (f: { page: number; status?: string }) =>
  queryOptions({ queryKey: mailKeys.outbox(f), queryFn: () => getOutbox(f), placeholderData: keepPreviousData, refetchInterval: 10_000 });

export function useOutbox(f: { page: number; status?: string }) {
  return useQuery(outboxQueryOptions(f));
}

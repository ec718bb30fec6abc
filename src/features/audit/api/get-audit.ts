import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditRow, Page } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';

export interface AuditFilters {
  page: number;
  pageSize: number;
  entityType?: string;
}

export const auditKeys = {
  all: ['audit'] as const,
  list: (f: AuditFilters) => [...auditKeys.all, 'list', f] as const,
};

export function getAudit(f: AuditFilters): Promise<Page<AuditRow>> {
  return apiClient.get<Page<AuditRow>>(`/api/audit${qs({ ...f })}`);
}

export const auditQueryOptions = (f: AuditFilters) =>
  queryOptions({ queryKey: auditKeys.list(f), queryFn: () => getAudit(f), placeholderData: keepPreviousData });

export function useAudit(f: AuditFilters) {
  return useQuery(auditQueryOptions(f));
}

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '../../../../shared/api/page.ts';
import type { DriftAlertRow } from '../../../../shared/api/supplier-quality.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { alertKeys, type AlertFilters } from './keys.ts';

export const ALERTS_PAGE_SIZE = 5;

export function getAlerts(f: AlertFilters): Promise<Page<DriftAlertRow>> {
  return apiClient.get(`/api/drift-alerts${qs({ page: f.page, pageSize: ALERTS_PAGE_SIZE, status: f.status, supplierId: f.supplierId })}`);
}

export const alertsQueryOptions = (f: AlertFilters) => queryOptions({ queryKey: alertKeys.list(f), queryFn: () => getAlerts(f), placeholderData: keepPreviousData });

export function useAlerts(f: AlertFilters) {
  return useQuery(alertsQueryOptions(f));
}

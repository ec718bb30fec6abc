import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ScorecardPeriod, SupplierScorecard } from '../../../../shared/api/supplier-quality.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { scorecardKeys } from './keys.ts';

export function getSupplierScorecard(supplierId: number, p: ScorecardPeriod): Promise<SupplierScorecard> {
  return apiClient.get(`/api/scorecards/${supplierId}${qs({ from: p.from, to: p.to })}`);
}

export const supplierScorecardQueryOptions = (supplierId: number, p: ScorecardPeriod) =>
  queryOptions({ queryKey: scorecardKeys.detail(supplierId, p), queryFn: () => getSupplierScorecard(supplierId, p) });

export function useSupplierScorecard(supplierId: number, p: ScorecardPeriod) {
  return useQuery(supplierScorecardQueryOptions(supplierId, p));
}

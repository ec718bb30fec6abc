import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { HistogramRuleParam, LotSummary } from '../../../../shared/api/lot-results.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { lotResultKeys } from './keys.ts';

export function getLotSummary(lotId: number, rule: HistogramRuleParam): Promise<LotSummary> {
  return apiClient.get<LotSummary>(`/api/lots/${lotId}/summary${qs({ histogram: rule })}`);
}

export const lotSummaryQueryOptions = (lotId: number, rule: HistogramRuleParam) =>
  queryOptions({ queryKey: lotResultKeys.summary(lotId, rule), queryFn: () => getLotSummary(lotId, rule), placeholderData: keepPreviousData });

export function useLotSummary(lotId: number, rule: HistogramRuleParam) {
  return useQuery(lotSummaryQueryOptions(lotId, rule));
}

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ScorecardPage, ScorecardPeriod } from '../../../../shared/api/supplier-quality.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { scorecardKeys, type ScorecardFilters } from './keys.ts';

export function getScorecards(f: ScorecardFilters): Promise<ScorecardPage> {
  return apiClient.get(`/api/scorecards${qs({ ...f })}`);
}

export const scorecardsQueryOptions = (f: ScorecardFilters) =>
  queryOptions({ queryKey: scorecardKeys.list(f), queryFn: () => getScorecards(f), placeholderData: keepPreviousData });

export function useScorecards(f: ScorecardFilters) {
  return useQuery(scorecardsQueryOptions(f));
}

/** The CSV export of the period, downloaded by the browser (same-origin cookie). */
export function scorecardsCsvUrl(p: ScorecardPeriod): string {
  return `/api/scorecards.csv${qs({ from: p.from, to: p.to })}`;
}

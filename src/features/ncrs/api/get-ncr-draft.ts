import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NcrDraft } from '../../../../shared/api/supplier-quality.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { ncrKeys } from './keys.ts';

export function getNcrDraft(lotId: number, alertId: number | null): Promise<NcrDraft> {
  return apiClient.get(`/api/ncrs/draft${qs({ lotId, alertId })}`);
}

export const ncrDraftQueryOptions = (lotId: number, alertId: number | null) =>
  queryOptions({ queryKey: ncrKeys.draft(lotId, alertId), queryFn: () => getNcrDraft(lotId, alertId), staleTime: Infinity });

export function useNcrDraft(lotId: number | null, alertId: number | null) {
  return useQuery({ ...ncrDraftQueryOptions(lotId ?? 0, alertId), enabled: lotId !== null && lotId > 0 });
}

import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { KitFilters, KitPage } from '../../../../shared/api/pairing.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

export function getKits(f: KitFilters): Promise<KitPage> {
  return apiClient.get<KitPage>(`/api/kits${qs({ ...f })}`);
}

export const kitsQueryOptions = (f: KitFilters) => queryOptions({ queryKey: kitKeys.list(f), queryFn: () => getKits(f), placeholderData: keepPreviousData });

export function useKits(f: KitFilters) {
  return useQuery(kitsQueryOptions(f));
}

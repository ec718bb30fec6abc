import { queryOptions, useQuery } from '@tanstack/react-query';
import type { KitDetail } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

export function getKit(id: number): Promise<KitDetail> {
  return apiClient.get<KitDetail>(`/api/kits/${id}`);
}

export const kitQueryOptions = (id: number) => queryOptions({ queryKey: kitKeys.detail(id), queryFn: () => getKit(id) });

export function useKit(id: number) {
  return useQuery({ ...kitQueryOptions(id), enabled: Number.isSafeInteger(id) && id > 0 });
}

/** Where the kit's PDFs are served (opened in a new tab; the session cookie goes along). */
export const kitPickListUrl = (id: number) => `/api/kits/${id}/pick-list.pdf`;
export const kitLabelUrl = (id: number) => `/api/kits/${id}/label.pdf`;

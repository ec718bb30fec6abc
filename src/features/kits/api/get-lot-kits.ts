import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LotKitRow } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

/** GET /api/lots/:id/kits — which kits hold parts of the lot. */
export function getLotKits(lotId: number): Promise<LotKitRow[]> {
  return apiClient.get<LotKitRow[]>(`/api/lots/${lotId}/kits`);
}

export const lotKitsQueryOptions = (lotId: number) => queryOptions({ queryKey: kitKeys.ofLot(lotId), queryFn: () => getLotKits(lotId) });

export function useLotKits(lotId: number) {
  return useQuery({ ...lotKitsQueryOptions(lotId), enabled: Number.isSafeInteger(lotId) && lotId > 0 });
}

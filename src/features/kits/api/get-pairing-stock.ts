import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PairingStockRow } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

export function getPairingStock(): Promise<PairingStockRow[]> {
  return apiClient.get<PairingStockRow[]>('/api/pairing/stock');
}

export const pairingStockQueryOptions = () => queryOptions({ queryKey: kitKeys.stock(), queryFn: getPairingStock });

export function usePairingStock() {
  return useQuery(pairingStockQueryOptions());
}

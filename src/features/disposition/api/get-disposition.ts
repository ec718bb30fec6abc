import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DispositionView } from '../../../../shared/api/disposition.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { dispositionKeys } from './keys.ts';

export function getDisposition(lotId: number): Promise<DispositionView> {
  return apiClient.get<DispositionView>(`/api/lots/${lotId}/disposition`);
}

export const dispositionQueryOptions = (lotId: number) => queryOptions({ queryKey: dispositionKeys.lot(lotId), queryFn: () => getDisposition(lotId) });

export function useDisposition(lotId: number) {
  return useQuery(dispositionQueryOptions(lotId));
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlaceScreenedRequest, PlaceScreenedResponse, ScreeningSetup } from '../../../../shared/api/bins.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

/** Places screened readings that have no place yet (idempotent). */
export function placeScreened({ lotId, ...body }: PlaceScreenedRequest & { lotId: number }): Promise<PlaceScreenedResponse> {
  return apiClient.post<PlaceScreenedResponse>(`/api/lots/${lotId}/screening/place`, { ...body });
}

export function usePlaceScreened() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: placeScreened, onSuccess: () => qc.invalidateQueries({ queryKey: binKeys.all }) });
}

export function saveScreeningSetup({ lotId, ...body }: ScreeningSetup & { lotId: number }): Promise<ScreeningSetup> {
  return apiClient.put<ScreeningSetup>(`/api/lots/${lotId}/screening/setup`, { ...body });
}

export function useSaveScreeningSetup() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: saveScreeningSetup, onSuccess: (_d, v) => qc.invalidateQueries({ queryKey: binKeys.lot(v.lotId) }) });
}

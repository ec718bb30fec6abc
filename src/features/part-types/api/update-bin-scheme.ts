import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BinSchemeInput, BinSchemeVersionRow } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function updateBinScheme({
  partTypeId,
  version,
  ...body
}: BinSchemeInput & { partTypeId: number; version: number }): Promise<BinSchemeVersionRow> {
  return apiClient.put<BinSchemeVersionRow>(`/api/part-types/${partTypeId}/bin-schemes/${version}`, { ...body });
}

/** Changes a version no lot uses yet; the server answers 409 `scheme-locked` otherwise. */
export function useUpdateBinScheme() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateBinScheme,
    onSuccess: (row) => void qc.invalidateQueries({ queryKey: partTypeKeys.schemes(row.partTypeId) }),
  });
}

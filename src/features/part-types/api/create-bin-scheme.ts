import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BinSchemeInput, BinSchemeVersionRow } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function createBinScheme({ partTypeId, ...body }: BinSchemeInput & { partTypeId: number }): Promise<BinSchemeVersionRow> {
  return apiClient.post<BinSchemeVersionRow>(`/api/part-types/${partTypeId}/bin-schemes`, { ...body });
}

/** Saves the bins as the part type's next scheme version. */
export function useCreateBinScheme() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createBinScheme,
    onSuccess: (row) => {
      void qc.invalidateQueries({ queryKey: partTypeKeys.detail(row.partTypeId) });
      void qc.invalidateQueries({ queryKey: partTypeKeys.lists() });
    },
  });
}

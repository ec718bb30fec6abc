import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PartTypeRow, PartTypeUpdate } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function updatePartType({ id, ...body }: PartTypeUpdate & { id: number }): Promise<PartTypeRow> {
  return apiClient.patch<PartTypeRow>(`/api/part-types/${id}`, { ...body });
}

export function useUpdatePartType() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updatePartType,
    onSuccess: (row) => {
      void qc.invalidateQueries({ queryKey: partTypeKeys.lists() });
      void qc.invalidateQueries({ queryKey: partTypeKeys.packages() });
      void qc.invalidateQueries({ queryKey: partTypeKeys.detail(row.id) });
    },
  });
}

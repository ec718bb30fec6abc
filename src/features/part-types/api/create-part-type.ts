import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PartTypeInput, PartTypeRow } from '../../../../shared/api/catalog.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { partTypeKeys } from './keys.ts';

export function createPartType(body: PartTypeInput): Promise<PartTypeRow> {
  return apiClient.post<PartTypeRow>('/api/part-types', { ...body });
}

export function useCreatePartType() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createPartType,
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: partTypeKeys.lists() });
      void qc.invalidateQueries({ queryKey: partTypeKeys.packages() });
    },
  });
}

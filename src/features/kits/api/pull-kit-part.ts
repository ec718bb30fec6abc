import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PullKitPartRequest, PullKitPartResponse } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { kitKeys } from './keys.ts';

/** POST /api/kits/:id/pull — one scan at the pick list. */
export function pullKitPart({ id, body }: { id: number; body: PullKitPartRequest }): Promise<PullKitPartResponse> {
  return apiClient.post<PullKitPartResponse>(`/api/kits/${id}/pull`, { ...body });
}

export function usePullKitPart() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: pullKitPart,
    onSuccess: (r) => {
      qc.setQueryData(kitKeys.detail(r.kit.id), r.kit);
      void qc.invalidateQueries({ queryKey: kitKeys.lists() });
      void qc.invalidateQueries({ queryKey: kitKeys.ofLots() });
    },
  });
}

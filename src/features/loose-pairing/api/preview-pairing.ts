import { useMutation } from '@tanstack/react-query';
import type { PairingPreviewRequest, PairingPreviewResponse } from '../../../../shared/api/pairing.ts';
import { apiClient } from '../../../lib/api-client.ts';

/** POST /api/pairing/preview: matched sets among loose parts measured by hand; nothing is stored. */
export function previewPairing(body: PairingPreviewRequest): Promise<PairingPreviewResponse> {
  return apiClient.post<PairingPreviewResponse>('/api/pairing/preview', { ...body });
}

export function usePreviewPairing() {
  return useMutation({ mutationFn: previewPairing });
}

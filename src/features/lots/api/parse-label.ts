import { useMutation } from '@tanstack/react-query';
import type { ParseLabelResponse } from '../../../../shared/api/labels.ts';
import { apiClient } from '../../../lib/api-client.ts';

/** Sends the scanned text as typed; the server applies the site's separator substitutes. */
export function parseLabel(text: string): Promise<ParseLabelResponse> {
  return apiClient.post<ParseLabelResponse>('/api/labels/parse', { text });
}

export function useParseLabel() {
  return useMutation({ mutationFn: parseLabel });
}

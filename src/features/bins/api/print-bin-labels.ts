import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BinLabelsRequest } from '../../../../shared/api/bins.ts';
import type { Problem } from '../../../../shared/api/problem.ts';
import { ApiError, apiClient } from '../../../lib/api-client.ts';
import { binKeys } from './keys.ts';

export interface PrintedLabels {
  /** An object URL of the PDF, to open or download; revoke it when done. */
  url: string;
  labels: number;
  reprints: number;
}

/**
 * POST /api/labels/bins.pdf answers a PDF, which the JSON client does not read, so this request
 * fetches the CSRF token itself and turns an error answer into the same ApiError.
 */
export async function printBinLabels(body: BinLabelsRequest): Promise<PrintedLabels> {
  const { csrfToken } = await apiClient.get<{ csrfToken: string }>('/api/auth/csrf');
  const res = await fetch('/api/labels/bins.pdf', {
    method: 'POST',
    credentials: 'same-origin',
    headers: { 'Content-Type': 'application/json', Accept: 'application/pdf, application/problem+json', 'x-csrf-token': csrfToken },
    body: JSON.stringify(body),
  });
  if (!res.ok) {
    let problem: Problem;
    try {
      problem = (await res.json()) as Problem;
    } catch {
      problem = { type: 'about:blank', title: res.statusText, status: res.status, detail: `The server answered ${res.status}.` };
    }
    throw new ApiError(problem);
  }
  const blob = await res.blob();
  return { url: URL.createObjectURL(blob), labels: body.containerIds.length, reprints: Number(res.headers.get('x-label-reprints') ?? 0) };
}

export function usePrintBinLabels() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: printBinLabels, onSuccess: () => qc.invalidateQueries({ queryKey: binKeys.containers() }) });
}

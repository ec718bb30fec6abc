import type { ImportMapping, ImportProgress, ImportResult, ImportUnits } from '../../../../shared/api/measurements.ts';
import type { Problem } from '../../../../shared/api/problem.ts';
import { ApiError, apiClient } from '../../../lib/api-client.ts';

export interface ImportRequest {
  lotId: number;
  sessionId: number;
  file: File;
  mapping: ImportMapping;
  units: ImportUnits;
}

export interface ImportCallbacks {
  /** Upload progress, 0…1, from the browser's XMLHttpRequest upload events. */
  onUpload?: (fraction: number) => void;
  /** The server's phase message (parsing, validating, writing…), polled while the server works. */
  onPhase?: (p: ImportProgress) => void;
}

function token(): string {
  return Array.from(crypto.getRandomValues(new Uint8Array(12)), (b) => b.toString(16).padStart(2, '0')).join('');
}

/**
 * Uploads a tester file with XMLHttpRequest (fetch has no upload progress) and follows the
 * server's phase while it validates and writes. Any non-2xx answer rejects with an ApiError
 * carrying the problem (a 422 lists the bad rows).
 */
export async function importMeasurements(req: ImportRequest, cb: ImportCallbacks = {}): Promise<ImportResult> {
  const { csrfToken } = await apiClient.get<{ csrfToken: string }>('/api/auth/csrf');
  const progressToken = token();
  const form = new FormData();
  form.append('sessionId', String(req.sessionId));
  form.append('mapping', JSON.stringify(req.mapping));
  form.append('units', JSON.stringify(req.units));
  form.append('progressToken', progressToken);
  form.append('file', req.file);

  let polling: ReturnType<typeof setInterval> | null = null;
  const poll = () => {
    apiClient
      .get<ImportProgress>(`/api/lots/${req.lotId}/measurements/import/progress/${progressToken}`)
      .then((p) => cb.onPhase?.(p))
      .catch(() => {});
  };
  try {
    return await new Promise<ImportResult>((resolve, reject) => {
      const xhr = new XMLHttpRequest();
      xhr.open('POST', `/api/lots/${req.lotId}/measurements/import`);
      xhr.setRequestHeader('x-csrf-token', csrfToken);
      xhr.setRequestHeader('Accept', 'application/json');
      xhr.upload.onprogress = (e) => {
        if (e.lengthComputable) cb.onUpload?.(e.loaded / e.total);
      };
      xhr.upload.onload = () => {
        cb.onUpload?.(1);
        cb.onPhase?.({ phase: 'receiving', done: 0, total: 0, message: 'File received; the server is checking it…' });
        polling ??= setInterval(poll, 400);
      };
      xhr.onerror = () => reject(new ApiError({ type: 'about:blank', title: 'Network error', status: 0, detail: 'The upload did not reach the server. Check the connection and try again.' }));
      xhr.onload = () => {
        let body: unknown = null;
        try {
          body = JSON.parse(xhr.responseText);
        } catch {
          body = null;
        }
        if (xhr.status >= 200 && xhr.status < 300) resolve(body as ImportResult);
        else reject(new ApiError((body as Problem) ?? { type: 'about:blank', title: xhr.statusText, status: xhr.status, detail: `The server answered ${xhr.status}.` }));
      };
      xhr.send(form);
    });
  } finally {
    if (polling) clearInterval(polling);
  }
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DocumentKind, LotDocumentRow } from '../../../../shared/api/lots.ts';
import type { Problem } from '../../../../shared/api/problem.ts';
import { ApiError, apiClient } from '../../../lib/api-client.ts';
import { lotKeys } from './keys.ts';

export interface UploadDocumentInput {
  lotId: number;
  file: File;
  kind: DocumentKind;
  /** Fraction sent, 0–1. */
  onProgress?: (fraction: number) => void;
}

function problemOf(xhr: XMLHttpRequest): Problem {
  try {
    return JSON.parse(xhr.responseText) as Problem;
  } catch {
    return { type: 'about:blank', title: xhr.statusText, status: xhr.status, detail: `The server answered ${xhr.status} ${xhr.statusText}.` };
  }
}

/**
 * Uploads one document as multipart form data. XMLHttpRequest rather than fetch because only it
 * reports upload progress; errors come back as the same ApiError the api client throws.
 */
export async function uploadDocument({ lotId, file, kind, onProgress }: UploadDocumentInput): Promise<LotDocumentRow> {
  const { csrfToken } = await apiClient.get<{ csrfToken: string }>('/api/auth/csrf');
  const form = new FormData();
  form.append('kind', kind);
  form.append('file', file, file.name);
  return new Promise<LotDocumentRow>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/lots/${lotId}/documents`);
    xhr.setRequestHeader('x-csrf-token', csrfToken);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.(e.loaded / e.total);
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) resolve(JSON.parse(xhr.responseText) as LotDocumentRow);
      else reject(new ApiError(problemOf(xhr)));
    };
    xhr.onerror = () => reject(new ApiError({ type: 'about:blank', title: 'Network error', status: 0, detail: 'The upload did not reach the server. Check the connection and try again.' }));
    xhr.send(form);
  });
}

export function useUploadDocument() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: uploadDocument,
    onSuccess: (doc) => qc.invalidateQueries({ queryKey: lotKeys.detail(doc.lotId) }),
  });
}

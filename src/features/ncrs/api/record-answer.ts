import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NcrDetail } from '../../../../shared/api/supplier-quality.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { ncrKeys } from './keys.ts';

/** The supplier's answer: text and one document, as multipart form data. */
export function recordAnswer({ id, text, file }: { id: number; text: string; file: File }): Promise<NcrDetail> {
  const form = new FormData();
  form.append('text', text);
  form.append('file', file, file.name);
  return apiClient.post(`/api/ncrs/${id}/answer`, form);
}

export function useRecordAnswer() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: recordAnswer,
    onSuccess: (ncr) => {
      qc.setQueryData(ncrKeys.detail(ncr.id), ncr);
      void qc.invalidateQueries({ queryKey: ncrKeys.lists() });
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient } from '../../../lib/api-client.ts';
import { mailKeys } from './keys.ts';

export function retryMail(id: number): Promise<{ sent: number; failed: number }> {
  return apiClient.post(`/api/mail/outbox/${id}/retry`);
}

export function useRetryMail() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: retryMail, onSettled: () => qc.invalidateQueries({ queryKey: mailKeys.all }) });
}

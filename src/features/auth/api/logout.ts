import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiClient, resetCsrf } from '../../../lib/api-client.ts';
import { authKeys } from './keys.ts';

export function logout(): Promise<void> {
  return apiClient.post<void>('/api/auth/logout');
}

export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSettled: () => {
      resetCsrf();
      qc.clear();
      qc.setQueryData(authKeys.me(), null);
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginRequest, LoginResponse } from '../../../../shared/api/auth.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { authKeys } from './keys.ts';

export function login(body: LoginRequest): Promise<LoginResponse> {
  return apiClient.post<LoginResponse>('/api/auth/login', { ...body });
}

export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: ({ user }) => {
      qc.clear();
      qc.setQueryData(authKeys.me(), user);
    },
  });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateUserRequest, UserRow } from '../../../../shared/api/users.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { userKeys } from './keys.ts';

export function createUser(body: CreateUserRequest): Promise<UserRow> {
  return apiClient.post<UserRow>('/api/users', { ...body });
}

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createUser, onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.lists() }) });
}

import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateUserRequest, UserRow } from '../../../../shared/api/users.ts';
import { apiClient } from '../../../lib/api-client.ts';
import { userKeys } from './keys.ts';

export function updateUser({ id, ...body }: UpdateUserRequest & { id: number }): Promise<UserRow> {
  return apiClient.patch<UserRow>(`/api/users/${id}`, { ...body });
}

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateUser, onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.lists() }) });
}

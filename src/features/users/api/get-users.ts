import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page, UserRow } from '../../../../shared/api/users.ts';
import { apiClient, qs } from '../../../lib/api-client.ts';
import { userKeys, type UserFilters } from './keys.ts';

export function getUsers(f: UserFilters): Promise<Page<UserRow>> {
  return apiClient.get<Page<UserRow>>(`/api/users${qs({ ...f })}`);
}

export const usersQueryOptions = (f: UserFilters) =>
  queryOptions({ queryKey: userKeys.list(f), queryFn: () => getUsers(f), placeholderData: keepPreviousData });

export function useUsers(f: UserFilters) {
  return useQuery(usersQueryOptions(f));
}

import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SessionUser } from '../../../../shared/api/auth.ts';
import { ApiError, apiClient } from '../../../lib/api-client.ts';
import { authKeys } from './keys.ts';

/** The signed-in user, or null when not signed in (401 is an answer here, not an error). */
export async function getMe(): Promise<SessionUser | null> {
  try {
    const { user } = await apiClient.get<{ user: SessionUser }>('/api/auth/me');
    return user;
  } catch (e) {
    if (e instanceof ApiError && e.status === 401) return null;
    throw e;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: authKeys.me(), queryFn: getMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}

import type { Role } from '../../../../shared/api/roles.ts';

export interface UserFilters {
  page: number;
  pageSize: number;
  search?: string;
  role?: Role | '';
  sort?: string;
  dir?: 'asc' | 'desc';
}

export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
  list: (filters: UserFilters) => [...userKeys.lists(), filters] as const,
};

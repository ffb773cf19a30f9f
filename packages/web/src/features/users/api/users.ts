import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type {
  NewUser,
  Role,
  User,
  UserChanges,
  UserList,
  UserOptions,
  UserStatus,
} from '../../../lib/api/types';

export interface UserFilters {
  search?: string;
  role?: Role | '';
  status?: UserStatus | '';
  practiceId?: number | '';
}

export const usersKeys = {
  all: ['users'] as const,
  list: (filters: UserFilters) => ['users', 'list', filters] as const,
  options: () => ['users', 'options'] as const,
};

function query(filters: UserFilters): string {
  const params = new URLSearchParams();
  if (filters.search?.trim()) params.set('search', filters.search.trim());
  if (filters.role) params.set('role', filters.role);
  if (filters.status) params.set('status', filters.status);
  if (filters.practiceId) params.set('practiceId', String(filters.practiceId));
  const text = params.toString();
  return text ? `?${text}` : '';
}

export const fetchUsers = (filters: UserFilters) =>
  apiFetch<UserList>(`/api/users${query(filters)}`);

export const usersQueryOptions = (filters: UserFilters) =>
  queryOptions({
    queryKey: usersKeys.list(filters),
    queryFn: () => fetchUsers(filters),
    placeholderData: (previous) => previous,
  });

export function useUsers(filters: UserFilters) {
  return useQuery(usersQueryOptions(filters));
}

export const userOptionsQueryOptions = () =>
  queryOptions({
    queryKey: usersKeys.options(),
    queryFn: () => apiFetch<UserOptions>('/api/users/options'),
    staleTime: 5 * 60_000,
  });

export function useUserOptions() {
  return useQuery(userOptionsQueryOptions());
}

export type UserChange =
  | { kind: 'update'; userId: number; changes: UserChanges }
  | { kind: 'assign'; userId: number; practiceId: number }
  | { kind: 'remove'; userId: number; practiceId: number }
  | { kind: 'deactivate'; userId: number }
  | { kind: 'reactivate'; userId: number };

function send(change: UserChange): Promise<User> {
  switch (change.kind) {
    case 'update':
      return apiFetch<User>(`/api/users/${change.userId}`, {
        method: 'PATCH',
        ...apiJson(change.changes),
      });
    case 'assign':
      return apiFetch<User>(`/api/users/${change.userId}/practices/${change.practiceId}`, {
        method: 'PUT',
      });
    case 'remove':
      return apiFetch<User>(`/api/users/${change.userId}/practices/${change.practiceId}`, {
        method: 'DELETE',
      });
    case 'deactivate':
      return apiFetch<User>(`/api/users/${change.userId}/deactivate`, { method: 'POST' });
    case 'reactivate':
      return apiFetch<User>(`/api/users/${change.userId}/reactivate`, { method: 'POST' });
  }
}

/** Every change to a person; the lists are refreshed afterwards (and the audit trail). */
export function useChangeUser() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: usersKeys.all });
      await client.invalidateQueries({ queryKey: ['audit-events'] });
    },
  });
}

export function useCreateUser() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (user: NewUser) =>
      apiFetch<User>('/api/users', { method: 'POST', ...apiJson(user) }),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: usersKeys.all });
      await client.invalidateQueries({ queryKey: ['audit-events'] });
    },
  });
}

/** The signed-in person's own mail preferences. */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type { MailKind, MailPreferences } from '../../../lib/api/types';

export const preferencesKeys = { mine: () => ['me', 'mail-preferences'] as const };

export const mailPreferencesQueryOptions = () =>
  queryOptions({
    queryKey: preferencesKeys.mine(),
    queryFn: () => apiFetch<MailPreferences>('/api/me/mail-preferences'),
  });

export function useMailPreferences() {
  return useQuery(mailPreferencesQueryOptions());
}

export function useSetMailPreferences() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (optedOut: MailKind[]) =>
      apiFetch<MailPreferences>('/api/me/mail-preferences', {
        method: 'PUT',
        ...apiJson({ optedOut }),
      }),
    onSuccess: (data) => client.setQueryData(preferencesKeys.mine(), data),
  });
}

/**
 * The regional lead's mail: deliveries per source, resending failed messages,
 * and each practice's recipients (extra addresses added and removed here).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type {
  DeliveryDetail,
  DeliverySourceList,
  MailKind,
  MailRecipients,
  NewExtraRecipient,
  PracticeRecipients,
  ResendResult,
} from '../../../lib/api/types';

export const mailKeys = {
  all: ['mail'] as const,
  deliveries: () => ['mail', 'deliveries'] as const,
  delivery: (kind: string, sourceId: number) => ['mail', 'deliveries', kind, sourceId] as const,
  recipients: () => ['mail', 'recipients'] as const,
};

/** While messages are queued or being sent, the page looks again every few seconds. */
const busyInterval = (busy: boolean) => (busy ? 3000 : false);

export const deliveriesQueryOptions = () =>
  queryOptions({
    queryKey: mailKeys.deliveries(),
    queryFn: () => apiFetch<DeliverySourceList>('/api/mail/deliveries'),
    refetchInterval: (query) =>
      busyInterval(
        (query.state.data?.sources ?? []).some((s) => s.counts.queued + s.counts.sending > 0),
      ),
  });

export function useDeliveries() {
  return useQuery(deliveriesQueryOptions());
}

export const deliveryQueryOptions = (kind: string, sourceId: number) =>
  queryOptions({
    queryKey: mailKeys.delivery(kind, sourceId),
    queryFn: () =>
      apiFetch<DeliveryDetail>(`/api/mail/deliveries/${encodeURIComponent(kind)}/${sourceId}`),
    refetchInterval: (query) => {
      const counts = query.state.data?.source.counts;
      return busyInterval(counts ? counts.queued + counts.sending > 0 : false);
    },
  });

export function useDelivery(kind: string, sourceId: number) {
  return useQuery(deliveryQueryOptions(kind, sourceId));
}

export type Resend = { kind: MailKind; sourceId: number } | { messageId: number };

export function useResend() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (what: Resend) =>
      apiFetch<ResendResult>(
        'messageId' in what
          ? `/api/mail/messages/${what.messageId}/resend`
          : `/api/mail/deliveries/${what.kind}/${what.sourceId}/resend`,
        { method: 'POST' },
      ),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: mailKeys.all });
      await client.invalidateQueries({ queryKey: ['audit-events'] });
    },
  });
}

export const recipientsQueryOptions = () =>
  queryOptions({
    queryKey: mailKeys.recipients(),
    queryFn: () => apiFetch<MailRecipients>('/api/mail/recipients'),
  });

export function useRecipients() {
  return useQuery(recipientsQueryOptions());
}

export type RecipientChange =
  | { kind: 'add'; practiceId: number; recipient: NewExtraRecipient }
  | { kind: 'remove'; practiceId: number; recipientId: number };

export function useChangeRecipients() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (change: RecipientChange) =>
      change.kind === 'add'
        ? apiFetch<PracticeRecipients>(`/api/practices/${change.practiceId}/mail-recipients`, {
            method: 'POST',
            ...apiJson(change.recipient),
          })
        : apiFetch<PracticeRecipients>(
            `/api/practices/${change.practiceId}/mail-recipients/${change.recipientId}`,
            { method: 'DELETE' },
          ),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: mailKeys.recipients() });
      await client.invalidateQueries({ queryKey: ['audit-events'] });
    },
  });
}

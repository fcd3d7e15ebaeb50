import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface OutboxMessage {
  id: string;
  kind: string;
  to: string;
  subject: string;
  body: string;
  status: 'pending' | 'sent' | 'failed';
  attempts: number;
  nextAttemptAt: string | null;
  lastError: string | null;
  createdAt: string;
  sentAt: string | null;
}

export interface ReceivedMail {
  to: string[];
  from: string;
  raw: string;
  subject: string;
  at: string;
}

export const outboxKeys = { list: ['outbox', 'list'] as const, received: ['outbox', 'received'] as const };

export const outboxQuery = () =>
  queryOptions({ queryKey: outboxKeys.list, queryFn: ({ signal }) => api<{ items: OutboxMessage[] }>('/outbox', { signal }), refetchInterval: 15_000 });

export const receivedQuery = () =>
  queryOptions({ queryKey: outboxKeys.received, queryFn: ({ signal }) => api<{ enabled: boolean; items: ReceivedMail[] }>('/outbox/received', { signal }), refetchInterval: 15_000 });

export function useRetry() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api<{ ok: true }>(`/outbox/${id}/retry`, { method: 'POST' }),
    onSettled: () => qc.invalidateQueries({ queryKey: ['outbox'] }),
  });
}

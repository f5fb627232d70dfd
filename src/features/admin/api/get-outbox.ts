import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { MailSummary } from '../../../../shared/api/admin.js';
import { api } from '../../../lib/api-client.js';
import { adminKeys } from './keys.js';

/** `GET /api/admin/outbox`, newest first whatever order the server sends. */
export async function getOutbox(signal?: AbortSignal): Promise<MailSummary[]> {
  const mails = await api.get<MailSummary[]>('/api/admin/outbox', signal);
  return [...mails].sort((a, b) => b.receivedAt.localeCompare(a.receivedAt) || b.id - a.id);
}

export function outboxQueryOptions() {
  return queryOptions({
    queryKey: adminKeys.mailList(),
    queryFn: ({ signal }) => getOutbox(signal),
    staleTime: 5_000,
  });
}

export function useOutbox() {
  return useSuspenseQuery(outboxQueryOptions());
}

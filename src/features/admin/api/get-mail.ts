import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { MailMessage } from '../../../../shared/api/admin.js';
import { api } from '../../../lib/api-client.js';
import { adminKeys } from './keys.js';

/** `GET /api/admin/outbox/:id`. */
export function getMail(id: number, signal?: AbortSignal): Promise<MailMessage> {
  return api.get<MailMessage>(`/api/admin/outbox/${id}`, signal);
}

export function mailQueryOptions(id: number) {
  return queryOptions({
    queryKey: adminKeys.mail(id),
    queryFn: ({ signal }) => getMail(id, signal),
    staleTime: Infinity,
  });
}

export function useMail(id: number) {
  return useSuspenseQuery(mailQueryOptions(id));
}

import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { mailQueryOptions, useMail } from '../../features/admin/api/get-mail.js';
import { MailView } from '../../features/admin/components/mail-view.js';

function parseMailId(raw: string | undefined): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) throw new Response('No message has that number.', { status: 404, statusText: 'Not Found' });
  return id;
}

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(mailQueryOptions(parseMailId(params.mailId)));
    return null;
  };
}

export function Component() {
  const id = parseMailId(useParams().mailId);
  const { data: mail } = useMail(id);
  return <MailView mail={mail} />;
}

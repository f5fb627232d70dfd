import type { QueryClient } from '@tanstack/react-query';
import { Outlet } from 'react-router-dom';
import { Button } from '../../components/ui/button.js';
import { EmptyState } from '../../components/ui/empty-state.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { outboxQueryOptions, useOutbox } from '../../features/admin/api/get-outbox.js';
import { OutboxList } from '../../features/admin/components/outbox-list.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function makeLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(outboxQueryOptions());
    return null;
  };
}

export function Component() {
  useDocumentTitle('Outbox');
  const outbox = useOutbox();
  const mails = outbox.data;
  return (
    <div>
      <PageHeader
        eyebrow="Admin"
        title="Outbox"
        description="Mail the server has sent, as the local mail sink received it. Links in a message can be followed from here."
        actions={
          <Button variant="secondary" size="sm" pending={outbox.isFetching} pendingLabel="Refreshing…" onClick={() => void outbox.refetch()}>
            Refresh
          </Button>
        }
      />
      {mails.length === 0 ? (
        <EmptyState title="No mail yet">Invitations and password resets appear here once they are sent.</EmptyState>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,20rem)_minmax(0,1fr)]">
          <nav aria-label="Messages">
            <OutboxList mails={mails} />
          </nav>
          <section aria-label="Message" className="min-w-0 rounded-lg border border-rule bg-paper-raised p-5 sm:p-6">
            <Outlet />
          </section>
        </div>
      )}
    </div>
  );
}

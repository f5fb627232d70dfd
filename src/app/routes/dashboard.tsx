import type { QueryClient } from '@tanstack/react-query';
import { ButtonLink } from '../../components/ui/button.js';
import { EmptyState } from '../../components/ui/empty-state.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { GlobalRolePanel } from '../../features/dashboard/components/global-role-panel.js';
import { StudioCards } from '../../features/dashboard/components/studio-cards.js';
import { studiosQueryOptions, useStudios } from '../../features/studios/api/get-studios.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function makeLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(studiosQueryOptions());
    return null;
  };
}

export function Component() {
  useDocumentTitle('My studios');
  const { data: me } = useMe();
  const { data: studios } = useStudios();
  if (!me) return null;
  const mine = studios.filter((s) => s.myRole !== null).sort((a, b) => a.name.localeCompare(b.name));
  const firstName = me.name.split(/\s+/)[0] || me.name;

  return (
    <div className="space-y-10">
      <PageHeader
        eyebrow="Dashboard"
        title={`Hello, ${firstName}`}
        description={
          mine.length > 0
            ? `You belong to ${mine.length} ${mine.length === 1 ? 'studio' : 'studios'}. Your role can differ from one studio to the next.`
            : undefined
        }
      />
      {me.globalRole ? <GlobalRolePanel role={me.globalRole} /> : null}
      <section aria-labelledby="my-studios-heading" className="space-y-4">
        <h2 id="my-studios-heading" className="text-xl font-semibold">
          My studios
        </h2>
        {mine.length > 0 ? (
          <StudioCards studios={mine} />
        ) : (
          <EmptyState
            title="You are not in any studio yet"
            action={
              me.globalRole === 'admin' ? (
                <ButtonLink to="/admin/studios" variant="primary">
                  Create a studio
                </ButtonLink>
              ) : undefined
            }
          >
            {me.globalRole === 'admin'
              ? 'As admin you can see every studio under All studios, and create one there.'
              : `An instructor adds you by sending an invitation to ${me.email}. Open the link in that e-mail and the studio appears here.`}
          </EmptyState>
        )}
      </section>
    </div>
  );
}

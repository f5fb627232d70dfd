import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { GlobalRole, StudioRole } from '../../../shared/api/roles.js';
import { ButtonLink } from '../../components/ui/button.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { EmptyState } from '../../components/ui/empty-state.js';
import { briefsQueryOptions, useBriefs } from '../../features/briefs/api/get-briefs.js';
import { BriefList } from '../../features/briefs/components/brief-list.js';
import { ErrorState } from '../../components/ui/error-state.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { RoleBadge } from '../../components/ui/role-badge.js';
import { Skeleton } from '../../components/ui/spinner.js';
import { meQueryOptions, useMe } from '../../features/auth/api/get-me.js';
import { invitationsQueryOptions, useInvitations } from '../../features/studios/api/get-invitations.js';
import { membersQueryOptions, useMembers } from '../../features/studios/api/get-members.js';
import { studioQueryOptions, useStudio } from '../../features/studios/api/get-studio.js';
import { InvitationsList } from '../../features/studios/components/invitations-list.js';
import { InviteForm } from '../../features/studios/components/invite-form.js';
import { MembersTable } from '../../features/studios/components/members-table.js';
import { formatDate } from '../../lib/format.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

/** Mirrors the server's policy (which decides): instructors of the studio, and admins everywhere. */
function canManageStudio(myRole: StudioRole | null, globalRole: GlobalRole | null): boolean {
  return myRole === 'instructor' || globalRole === 'admin';
}

function parseStudioId(raw: string | undefined): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) {
    throw new Response('A studio address ends in its number, such as /studios/1.', { status: 404, statusText: 'Not Found' });
  }
  return id;
}

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const studioId = parseStudioId(params.studioId);
    const [studio, me] = await Promise.all([
      queryClient.ensureQueryData(studioQueryOptions(studioId)),
      queryClient.ensureQueryData(meQueryOptions()),
    ]);
    // Lists that may be refused show their own message in their card, so they do not fail the page.
    await Promise.allSettled([
      queryClient.ensureQueryData(briefsQueryOptions(studioId)),
      queryClient.ensureQueryData(membersQueryOptions(studioId)),
      canManageStudio(studio.myRole, me?.globalRole ?? null) ? queryClient.ensureQueryData(invitationsQueryOptions(studioId)) : null,
    ]);
    return null;
  };
}

function TableSkeleton() {
  return (
    <div className="space-y-2" aria-hidden="true">
      <Skeleton className="h-8 w-60" />
      <Skeleton className="h-10 w-full" />
      <Skeleton className="h-10 w-full" />
      <Skeleton className="h-10 w-full" />
    </div>
  );
}

export function Component() {
  const studioId = parseStudioId(useParams().studioId);
  const { data: studio } = useStudio(studioId);
  const { data: me } = useMe();
  const canManage = canManageStudio(studio.myRole, me?.globalRole ?? null);
  const members = useMembers(studioId);
  const briefs = useBriefs(studioId);
  const canWriteBriefs = studio.myRole === 'instructor' || me?.globalRole === 'admin';
  const invitations = useInvitations(studioId, canManage);
  useDocumentTitle(studio.name);

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow="Studio"
        title={studio.name}
        description={
          <div className="space-y-3">
            {studio.description ? <p className="whitespace-pre-line">{studio.description}</p> : null}
            <p className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
              {studio.myRole ? (
                <span className="inline-flex items-center gap-2">
                  Your role <RoleBadge role={studio.myRole} />
                </span>
              ) : (
                <span>You are not a member; you see this studio as admin.</span>
              )}
              <span className="font-mono text-xs">
                {studio.memberCount} {studio.memberCount === 1 ? 'member' : 'members'} · since {formatDate(studio.createdAt)}
              </span>
            </p>
          </div>
        }
      />

      <Card aria-labelledby="briefs-heading">
        <CardHeader
          id="briefs-heading"
          title="Briefs"
          description={canWriteBriefs ? 'Drafts are visible to instructors only until they are published.' : 'The briefs of this studio, with their deadlines.'}
          actions={
            canWriteBriefs ? (
              <ButtonLink to={`/studios/${studioId}/briefs/new`} variant="primary" size="sm">
                New brief
              </ButtonLink>
            ) : undefined
          }
        />
        {briefs.isPending ? (
          <TableSkeleton />
        ) : briefs.isError ? (
          <ErrorState title="The briefs could not be loaded" error={briefs.error} onRetry={() => void briefs.refetch()} />
        ) : briefs.data.length === 0 ? (
          <EmptyState title="No briefs yet">
            {canWriteBriefs ? 'Write the first brief with “New brief”: its text, constraints, rubric and deadline.' : 'When an instructor publishes a brief, it appears here.'}
          </EmptyState>
        ) : (
          <BriefList briefs={briefs.data} canManage={canWriteBriefs} />
        )}
      </Card>

      <Card aria-labelledby="members-heading">
        <CardHeader
          id="members-heading"
          title="Members"
          description={canManage ? 'Change a role from the list, or remove someone from the studio.' : 'Everyone in this studio and their role here.'}
        />
        {members.isPending ? (
          <TableSkeleton />
        ) : members.isError ? (
          <ErrorState title="The member list could not be loaded" error={members.error} onRetry={() => void members.refetch()} />
        ) : (
          <MembersTable studioId={studioId} members={members.data} canManage={canManage} currentUserId={me?.id ?? -1} />
        )}
      </Card>

      {canManage ? (
        <div className="grid gap-8 lg:grid-cols-2">
          <Card aria-labelledby="invite-heading">
            <CardHeader
              id="invite-heading"
              title="Invite someone"
              description="They get an e-mail with a link to join this studio in the role you choose."
            />
            <InviteForm studioId={studioId} studioName={studio.name} />
          </Card>
          <Card aria-labelledby="invitations-heading">
            <CardHeader id="invitations-heading" title="Pending invitations" description="Links that have not been used yet." />
            {invitations.isPending ? (
              <TableSkeleton />
            ) : invitations.isError ? (
              <ErrorState title="Invitations could not be loaded" error={invitations.error} onRetry={() => void invitations.refetch()} />
            ) : (
              <InvitationsList studioId={studioId} invitations={invitations.data} />
            )}
          </Card>
        </div>
      ) : null}
    </div>
  );
}

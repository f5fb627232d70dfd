import { useState } from 'react';
import { useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { PinupState } from '../../../shared/api/critique.js';
import { Button, ButtonLink } from '../../components/ui/button.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { ConfirmAction } from '../../components/ui/confirm-action.js';
import { describeError } from '../../components/ui/error-state.js';
import { FormStatus, type FormStatusValue } from '../../components/ui/form-status.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { BriefCrumbs } from '../../components/ui/brief-crumbs.js';
import { meQueryOptions, useMe } from '../../features/auth/api/get-me.js';
import { briefQueryOptions } from '../../features/briefs/api/get-brief.js';
import { forgetPinup, useDeletePinup } from '../../features/pinups/api/delete-pinup.js';
import { pinupQueryOptions, usePinup } from '../../features/pinups/api/get-pinup.js';
import { pinupKeys } from '../../features/pinups/api/keys.js';
import { useUpdatePinup } from '../../features/pinups/api/update-pinup.js';
import { PinupForm } from '../../features/pinups/components/pinup-form.js';
import { PinupStateBadge } from '../../features/pinups/components/pinup-state-badge.js';
import { formatDuration, formatPinupTime } from '../../features/pinups/components/pinup-words.js';
import { RunningOrder } from '../../features/pinups/components/running-order.js';
import { membersQueryOptions, useMembers } from '../../features/studios/api/get-members.js';
import { studioQueryOptions, useStudio } from '../../features/studios/api/get-studio.js';
import { useAssignCritics } from '../../features/submissions/api/assign-critics.js';
import { submissionsQueryOptions } from '../../features/submissions/api/get-submissions.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const pinupId = parseIdParam(params.pinupId, 'pin-up', '/pinups/1');
    // A refusal or a missing session is the server's answer, shown by the error page as it is.
    const pinup = await queryClient.ensureQueryData(pinupQueryOptions(pinupId));
    const [studio, me] = await Promise.all([queryClient.ensureQueryData(studioQueryOptions(pinup.studioId)), queryClient.ensureQueryData(meQueryOptions())]);
    const manage = studio.myRole === 'instructor' || me?.globalRole === 'admin';
    await Promise.allSettled([
      queryClient.ensureQueryData(briefQueryOptions(pinup.briefId)),
      manage ? queryClient.ensureQueryData(membersQueryOptions(pinup.studioId)) : null,
      manage ? queryClient.ensureQueryData(submissionsQueryOptions(pinup.briefId, {})) : null,
    ]);
    return null;
  };
}

const NEXT_STATES: Record<PinupState, { to: PinupState; label: string; variant: 'primary' | 'secondary' }[]> = {
  scheduled: [{ to: 'running', label: 'Start the pin-up', variant: 'primary' }],
  running: [
    { to: 'finished', label: 'Finish the pin-up', variant: 'primary' },
    { to: 'scheduled', label: 'Back to scheduled', variant: 'secondary' },
  ],
  finished: [{ to: 'scheduled', label: 'Reopen as scheduled', variant: 'secondary' }],
};

export function Component() {
  const pinupId = parseIdParam(useParams().pinupId, 'pin-up', '/pinups/1');
  const query = usePinup(pinupId);
  return (
    <QueryView query={query} loadingLabel="Loading the pin-up…" errorTitle="The pin-up could not be loaded">
      {(pinup) => <PinupPage pinupId={pinup.id} studioId={pinup.studioId} briefId={pinup.briefId} />}
    </QueryView>
  );
}

function PinupPage({ pinupId, studioId, briefId }: { pinupId: number; studioId: number; briefId: number }) {
  const { data: pinup } = useSuspenseQuery(pinupQueryOptions(pinupId));
  const { data: studio } = useStudio(studioId);
  const { data: me } = useMe();
  const brief = useQuery(briefQueryOptions(briefId));
  // The server decides every change; this only hides controls others may not use.
  const manage = studio.myRole === 'instructor' || me?.globalRole === 'admin';
  const members = useMembers(studioId);
  const submissions = useQuery({ ...submissionsQueryOptions(briefId, {}), enabled: manage });
  const update = useUpdatePinup(pinupId);
  const remove = useDeletePinup(pinupId);
  const assign = useAssignCritics();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [editing, setEditing] = useState(false);
  const [status, setStatus] = useState<FormStatusValue>(null);
  useDocumentTitle(pinup.title);

  const critics = (members.data ?? []).filter((m) => m.role === 'critic').map((m) => ({ id: m.userId, name: m.name }));
  const options = (submissions.data ?? []).map((r) => ({ submissionId: r.submissionId, participantName: r.participant.name, latestRevision: r.latestRevision?.number ?? null }));

  const changeState = async (to: PinupState) => {
    setStatus(null);
    try {
      const saved = await update.mutateAsync({ state: to });
      setStatus({ kind: 'success', message: to === 'running' ? 'The pin-up is running.' : to === 'finished' ? 'The pin-up is finished.' : 'The pin-up is scheduled again.' });
      return saved;
    } catch (error) {
      setStatus({ kind: 'error', message: describeError(error) });
      return null;
    }
  };

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow={<BriefCrumbs studio={studio} briefId={pinup.briefId} briefTitle={brief.data?.title ?? pinup.briefTitle} />}
        title={pinup.title}
        description={
          <span className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
            <PinupStateBadge state={pinup.state} />
            <span>
              <time dateTime={pinup.startsAt}>{formatPinupTime(pinup)}</time> ({formatDuration(pinup.durationMinutes)})
            </span>
            {pinup.room ? <span>Room: {pinup.room}</span> : <span>No room given</span>}
            <span>Planned by {pinup.createdBy.name}</span>
          </span>
        }
        actions={
          <>
            {pinup.entries.length > 0 ? (
              <ButtonLink to={`/pinups/${pinup.id}/present`} variant={pinup.state === 'running' ? 'primary' : 'secondary'}>
                Present
              </ButtonLink>
            ) : null}
            {manage
              ? NEXT_STATES[pinup.state].map((s) => (
                  <Button key={s.to} variant={s.variant} pending={update.isPending && update.variables?.state === s.to} pendingLabel="Saving…" onClick={() => void changeState(s.to)}>
                    {s.label}
                  </Button>
                ))
              : null}
          </>
        }
      />
      <FormStatus status={status} />

      {manage ? (
        <Card aria-labelledby="pinup-manage-heading">
          <CardHeader
            id="pinup-manage-heading"
            title="Plan"
            description="Change the time, room or running order, or delete the session."
            actions={
              <>
                {!editing ? (
                  <Button variant="secondary" onClick={() => setEditing(true)}>
                    Edit pin-up
                  </Button>
                ) : null}
                <ConfirmAction
                  label="Delete pin-up"
                  question={`Delete “${pinup.title}”? Its pins and comments stay on the revisions.`}
                  confirmLabel="Yes, delete"
                  pendingLabel="Deleting…"
                  pending={remove.isPending}
                  onConfirm={async () => {
                    setStatus(null);
                    try {
                      await remove.mutateAsync();
                    } catch (error) {
                      setStatus({ kind: 'error', message: describeError(error) });
                      throw error;
                    }
                    await navigate(`/briefs/${pinup.briefId}`, { replace: true });
                    forgetPinup(queryClient, pinup.id);
                  }}
                />
              </>
            }
          />
          {editing ? (
            submissions.isError ? (
              <p className="text-sm text-signal-error">The brief’s submissions could not be loaded: {describeError(submissions.error)}</p>
            ) : (
              <PinupForm
                pinup={pinup}
                options={options}
                ariaLabel="Edit the pin-up"
                submitLabel="Save changes"
                onCancel={() => setEditing(false)}
                onSave={async (values) => {
                  const saved = await update.mutateAsync(values);
                  setEditing(false);
                  setStatus({ kind: 'success', message: `Saved “${saved.title}”.` });
                  return saved;
                }}
              />
            )
          ) : (
            <p className="text-sm text-ink-soft">
              {pinup.entries.length} {pinup.entries.length === 1 ? 'entry' : 'entries'} in the running order. Assign critics per entry below.
            </p>
          )}
        </Card>
      ) : null}

      <Card aria-labelledby="running-order-heading">
        <CardHeader
          id="running-order-heading"
          title="Running order"
          description={pinup.state === 'running' ? 'The session is running; pin counts update by themselves.' : 'Each entry’s latest revision, its pins and its critics.'}
        />
        {manage && members.isError ? <p className="mb-3 text-sm text-signal-error">The studio’s critics could not be loaded: {describeError(members.error)}</p> : null}
        <RunningOrder
          entries={pinup.entries}
          critics={manage && members.data ? critics : undefined}
          onAssignCritics={
            manage
              ? async (submissionId, userIds) => {
                  await assign.mutateAsync({ submissionId, userIds });
                  await queryClient.invalidateQueries({ queryKey: pinupKeys.detail(pinup.id) });
                }
              : undefined
          }
          presentHref={(position) => `/pinups/${pinup.id}/present?entry=${position}`}
        />
      </Card>
    </div>
  );
}

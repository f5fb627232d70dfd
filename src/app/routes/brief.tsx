import { useState } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { GlobalRole, StudioRole } from '../../../shared/api/roles.js';
import { AuditStateBadge } from '../../components/ui/audit-state-badge.js';
import { Button, ButtonLink, buttonClasses } from '../../components/ui/button.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { MarkdownView } from '../../components/ui/markdown-view.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { briefChangesQueryOptions, useBriefChanges } from '../../features/briefs/api/get-brief-changes.js';
import { briefQueryOptions, briefTemplateUrl, useBrief } from '../../features/briefs/api/get-brief.js';
import { briefKeys } from '../../features/briefs/api/keys.js';
import { BriefChangelog } from '../../features/briefs/components/brief-changelog.js';
import { BriefStateBadge } from '../../features/briefs/components/brief-state-badge.js';
import { ConstraintsSummary } from '../../features/briefs/components/constraints-summary.js';
import { SafetyCautions } from '../../features/materials/components/safety-cautions.js';
import { useCreatePinup } from '../../features/pinups/api/create-pinup.js';
import { pinupsQueryOptions, usePinups } from '../../features/pinups/api/get-pinups.js';
import { PinupForm } from '../../features/pinups/components/pinup-form.js';
import { PinupList } from '../../features/pinups/components/pinup-list.js';
import { describeError } from '../../components/ui/error-state.js';
import { submissionQueryOptions, useSubmission } from '../../features/revisions/api/get-submission.js';
import { RevisionsList } from '../../features/revisions/components/revisions-list.js';
import { UploadRevisionPanel } from '../../features/revisions/components/upload-revision-panel.js';
import { studioQueryOptions, useStudio } from '../../features/studios/api/get-studio.js';
import { submissionsQueryOptions } from '../../features/submissions/api/get-submissions.js';
import { formatDateTime, formatTimeLeft } from '../../lib/format.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { parseIdParam } from './route-params.js';

function canManage(myRole: StudioRole | null, globalRole: GlobalRole | null | undefined): boolean {
  return myRole === 'instructor' || globalRole === 'admin';
}

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const briefId = parseIdParam(params.briefId, 'brief', '/briefs/1');
    const brief = await queryClient.ensureQueryData(briefQueryOptions(briefId));
    await Promise.allSettled([
      queryClient.ensureQueryData(studioQueryOptions(brief.studioId)),
      brief.mySubmission ? queryClient.ensureQueryData(submissionQueryOptions(brief.mySubmission.id)) : null,
      brief.state !== 'draft' ? queryClient.ensureQueryData(briefChangesQueryOptions(briefId)) : null,
      brief.state !== 'draft' ? queryClient.ensureQueryData(pinupsQueryOptions(briefId)) : null,
    ]);
    return null;
  };
}

export function Component() {
  const briefId = parseIdParam(useParams().briefId, 'brief', '/briefs/1');
  const { data: brief } = useBrief(briefId);
  const { data: studio } = useStudio(brief.studioId);
  const { data: me } = useMe();
  const manage = canManage(studio.myRole, me?.globalRole);
  const participant = studio.myRole === 'participant';
  const submission = useSubmission(brief.mySubmission?.id ?? null);
  const changes = useBriefChanges(briefId, brief.state !== 'draft');
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  useDocumentTitle(brief.title);
  const open = brief.state === 'published';
  const past = Date.parse(brief.deadline) < Date.now();

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow={<Link to={`/studios/${studio.id}`}>{studio.name}</Link>}
        title={brief.title}
        description={
          <span className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
            <BriefStateBadge state={brief.state} />
            <span>
              Deadline <span className="font-medium text-ink">{formatDateTime(brief.deadline)}</span>
              {brief.state === 'published' ? <span> · {formatTimeLeft(brief.deadline)}</span> : null}
            </span>
            {brief.critiqueWindow ? (
              <span>
                Critique {formatDateTime(brief.critiqueWindow.opensAt)} – {formatDateTime(brief.critiqueWindow.closesAt)}
              </span>
            ) : null}
          </span>
        }
        actions={
          manage || studio.myRole === 'critic' ? (
            <>
              {manage ? <ButtonLink to={`/briefs/${brief.id}/edit`}>Edit brief</ButtonLink> : null}
              {brief.state !== 'draft' ? (
                <ButtonLink to={`/briefs/${brief.id}/submissions`} variant="primary">
                  {manage ? 'Submissions' : 'Submissions assigned to me'}
                </ButtonLink>
              ) : null}
            </>
          ) : undefined
        }
      />

      <div className="grid gap-8 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <Card aria-labelledby="brief-text-heading" className="self-start">
          <CardHeader id="brief-text-heading" title="The brief" />
          {brief.body.trim() ? <MarkdownView source={brief.body} /> : <p className="text-sm text-ink-soft">The instructor has not written a text for this brief.</p>}
        </Card>
        <div className="space-y-8">
          <Card aria-labelledby="constraints-heading">
            <CardHeader id="constraints-heading" title="Constraints" description="Every revision is audited against these." />
            <ConstraintsSummary brief={brief} />
          </Card>
          <Card aria-labelledby="templates-heading">
            <CardHeader
              id="templates-heading"
              title="Drawing templates"
              description="One SVG per family: its plane with the other planes' traces and the joint lines marked, a millimetre grid and a layer for the motif."
            />
            {brief.templateFamilies.length === 0 ? (
              <p className="text-sm text-ink-soft">This brief names no families; download templates from a revision's page once you have uploaded one.</p>
            ) : (
              <ul className="flex flex-wrap gap-2">
                {brief.templateFamilies.map((f) => (
                  <li key={f.id}>
                    <a href={briefTemplateUrl(brief.id, f.id)} download className={buttonClasses('secondary', 'sm')} aria-label={`Download the drawing template of ${f.label}`}>
                      {f.label} (SVG)
                    </a>
                  </li>
                ))}
              </ul>
            )}
          </Card>
          <SafetyCautions compact />
        </div>
      </div>

      {participant ? (
        <Card aria-labelledby="my-submission-heading">
          <CardHeader
            id="my-submission-heading"
            title="Your submission"
            description={
              brief.mySubmission?.auditState ? (
                <span className="inline-flex items-center gap-2">
                  Latest: revision {brief.mySubmission.latestRevision} <AuditStateBadge state={brief.mySubmission.auditState} />
                </span>
              ) : (
                'Each upload is a new numbered revision, audited at once.'
              )
            }
          />
          {brief.mySubmission ? (
            <>
              <QueryView query={submission} loadingLabel="Loading your revisions…" errorTitle="Your revisions could not be loaded">
                {(s) => <RevisionsList revisions={s.revisions} />}
              </QueryView>
              <p className="mt-4 text-sm">
                <Link to={`/submissions/${brief.mySubmission.id}/feedback`}>Your feedback and mark</Link>
                <span className="text-ink-soft"> · shown once the instructor releases it</span>
              </p>
            </>
          ) : (
            <RevisionsList revisions={[]} />
          )}
          <div className="mt-6 border-t border-rule pt-6">
            <h3 className="mb-3 text-lg font-semibold">Upload a revision</h3>
            {open ? (
              <>
                {past ? (
                  <p className="mb-3 text-sm text-ink-soft">
                    The deadline has passed.{' '}
                    {brief.latePolicy === 'refuse' ? 'This brief refuses late revisions.' : brief.latePolicy === 'accept-marked-late' ? 'A revision now is marked late.' : 'Late revisions are still accepted.'}
                  </p>
                ) : null}
                <UploadRevisionPanel
                  briefId={brief.id}
                  groups={brief.constraints.allowedGroups}
                  onUploaded={(revision) => {
                    void queryClient.invalidateQueries({ queryKey: briefKeys.detail(brief.id) });
                    void navigate(`/revisions/${revision.id}`);
                  }}
                />
              </>
            ) : (
              <p className="text-sm text-ink-soft">{brief.state === 'closed' ? 'This brief is closed; no more revisions are taken.' : 'This brief is not published yet.'}</p>
            )}
          </div>
        </Card>
      ) : null}

      {brief.state !== 'draft' ? <PinupsSection briefId={brief.id} manage={manage} /> : null}

      {brief.state !== 'draft' ? (
        <Card aria-labelledby="brief-changes-heading">
          <CardHeader id="brief-changes-heading" title="Changes to this brief" />
          <QueryView query={changes} loadingLabel="Loading the changelog…" errorTitle="The changelog could not be loaded">
            {(list) => <BriefChangelog changes={list} />}
          </QueryView>
        </Card>
      ) : null}
    </div>
  );
}

/** The brief's pin-up sessions for everyone who sees the brief, and the schedule form for instructors. */
function PinupsSection({ briefId, manage }: { briefId: number; manage: boolean }) {
  const pinups = usePinups(briefId);
  const [scheduling, setScheduling] = useState(false);
  const submissions = useQuery({ ...submissionsQueryOptions(briefId, {}), enabled: manage && scheduling });
  const create = useCreatePinup(briefId);
  const options = (submissions.data ?? []).map((r) => ({ submissionId: r.submissionId, participantName: r.participant.name, latestRevision: r.latestRevision?.number ?? null }));

  return (
    <Card aria-labelledby="pinups-heading">
      <CardHeader
        id="pinups-heading"
        title="Pin-ups"
        description="Critique sessions that walk through the submissions in a running order. Times are in your local time."
        actions={
          manage && !scheduling ? (
            <Button variant="secondary" onClick={() => setScheduling(true)}>
              Schedule a pin-up
            </Button>
          ) : undefined
        }
      />
      {manage && scheduling ? (
        <div className="mb-6 rounded-lg border border-rule bg-paper p-4">
          <h3 className="mb-3 text-base font-semibold">Schedule a pin-up</h3>
          {submissions.isPending ? (
            <p role="status" className="text-sm text-ink-soft">
              Loading the submissions…
            </p>
          ) : submissions.isError ? (
            <div role="alert" className="space-y-2 text-sm">
              <p className="text-signal-error">The submissions could not be loaded: {describeError(submissions.error)}</p>
              <Button variant="secondary" size="sm" onClick={() => void submissions.refetch()}>
                Try again
              </Button>
            </div>
          ) : (
            <PinupForm
              options={options}
              ariaLabel="Schedule a pin-up"
              submitLabel="Schedule pin-up"
              pendingLabel="Scheduling…"
              onCancel={() => setScheduling(false)}
              onSave={(values) => create.mutateAsync(values)}
            />
          )}
        </div>
      ) : null}
      <QueryView query={pinups} loadingLabel="Loading the pin-ups…" errorTitle="The pin-ups could not be loaded">
        {(list) => <PinupList pinups={list} emptyHint={manage ? 'Schedule one to walk through the submissions with the critics.' : undefined} />}
      </QueryView>
    </Card>
  );
}

import { useQuery, type QueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { AuditStateBadge } from '../../components/ui/audit-state-badge.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { BriefCrumbs } from '../../components/ui/brief-crumbs.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { briefQueryOptions } from '../../features/briefs/api/get-brief.js';
import { revisionPinsQueryOptions } from '../../features/pins/api/get-revision-pins.js';
import { RevisionCritique } from '../compositions/revision-critique.js';
import { auditPollInterval } from '../../features/revisions/api/audit-polling.js';
import { historyQueryOptions, useHistory } from '../../features/revisions/api/get-submission.js';
import { revisionQueryOptions, useRevision } from '../../features/revisions/api/get-revision.js';
import { AuditStatus } from '../../features/revisions/components/audit-status.js';
import { AuditSummary, SheetEstimate } from '../../features/revisions/components/audit-summary.js';
import { FindingsTable, type FindingRow } from '../../features/revisions/components/findings-table.js';
import { PhotoThumbnails, RevisionDownloads } from '../../features/revisions/components/revision-files.js';
import { RevisionHistory } from '../../features/revisions/components/revision-history.js';
import { studioQueryOptions, useStudio } from '../../features/studios/api/get-studio.js';
import { formatDateTime } from '../../lib/format.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const revisionId = parseIdParam(params.revisionId, 'revision', '/revisions/1');
    const revision = await queryClient.ensureQueryData(revisionQueryOptions(revisionId));
    await Promise.allSettled([
      queryClient.ensureQueryData(studioQueryOptions(revision.studioId)),
      queryClient.ensureQueryData(historyQueryOptions(revision.submissionId)),
      queryClient.ensureQueryData(briefQueryOptions(revision.briefId)),
      // The pins may not load (a server without them yet); the page then shows the list's error.
      queryClient.ensureQueryData(revisionPinsQueryOptions(revisionId)),
    ]);
    return null;
  };
}

export function Component() {
  const revisionId = parseIdParam(useParams().revisionId, 'revision', '/revisions/1');
  const { data: revision } = useRevision(revisionId);
  const { data: studio } = useStudio(revision.studioId);
  const { data: me } = useMe();
  const brief = useQuery(briefQueryOptions(revision.briefId));
  const audit = revision.audit;
  const history = useHistory(revision.submissionId, auditPollInterval(audit.state) !== false);
  const report = audit.state === 'done' ? audit.report : null;
  const canRetry = me?.id === revision.participant.id || studio.myRole === 'instructor' || me?.globalRole === 'admin';
  useDocumentTitle(`Revision ${revision.number} · ${revision.participant.name}`);
  // The finding shown on the model, remembered with its revision so another revision starts clear.
  const [shown, setShown] = useState<{ revisionId: number; finding: FindingRow } | null>(null);
  const shownFinding = shown && shown.revisionId === revision.id ? shown.finding : null;
  const focus = useMemo(() => (shownFinding ? { label: shownFinding.code, pieces: shownFinding.pieces } : null), [shownFinding]);
  // The row's button is a toggle: pressing the shown finding again returns to the whole model.
  const onSelectFinding = useCallback(
    (finding: FindingRow) => setShown((current) => (current && current.revisionId === revision.id && current.finding === finding ? null : { revisionId: revision.id, finding })),
    [revision.id],
  );
  const onClearFocus = useCallback(() => setShown(null), []);
  const critiqueViewer = useMemo(() => (me ? { id: me.id, name: me.name, role: studio.myRole } : null), [me, studio.myRole]);

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow={<BriefCrumbs studio={studio} briefId={revision.briefId} briefTitle={brief.data?.title ?? 'Brief'} />}
        title={`Revision ${revision.number}${revision.title ? `: ${revision.title}` : ''}`}
        description={
          <span className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
            <span>{revision.participant.name}</span>
            <span>Uploaded {formatDateTime(revision.createdAt)}</span>
            <span>{revision.source === 'file' ? 'From a design document' : 'Built from outlines'}</span>
            {revision.late ? <span className="rounded-sm border border-ink-soft px-1.5 font-mono text-xs">late</span> : null}
            <AuditStateBadge state={audit.state} />
            <Link to={`/submissions/${revision.submissionId}/feedback`}>Rubric feedback</Link>
          </span>
        }
      />

      <Card aria-labelledby="audit-heading">
        <CardHeader id="audit-heading" title="Audit" />
        <AuditStatus revisionId={revision.id} audit={audit} canRetry={canRetry} />
        {report ? (
          <div className="mt-6 space-y-6">
            <AuditSummary report={report} />
            {report.sheets ? (
              <section aria-labelledby="sheets-heading">
                <h3 id="sheets-heading" className="mb-2 text-sm font-semibold">
                  Sheet estimate
                </h3>
                <SheetEstimate sheets={report.sheets} />
              </section>
            ) : null}
          </div>
        ) : null}
      </Card>

      <Card aria-labelledby="model-heading">
        <CardHeader
          id="model-heading"
          title="Model and pins"
          description="Every piece as a slab of the material, coloured by family, with the audit's joints; critics' pins and their threads beside it."
        />
        {audit.state === 'failed' && !report ? <p className="mb-3 text-sm text-ink-soft">The model is shown once an audit succeeds.</p> : null}
        <RevisionCritique key={revision.id} revision={revision} report={report} viewer={critiqueViewer} focus={focus} onClearFocus={onClearFocus} />
      </Card>

      {report ? (
        <Card aria-labelledby="findings-heading">
          <CardHeader id="findings-heading" title="Findings" description="Sort by a column; filter by severity, code or words such as a piece id; show a finding's pieces on the model." />
          <FindingsTable findings={report.findings} onSelectFinding={onSelectFinding} selectedFinding={shownFinding} />
        </Card>
      ) : null}

      <div className="grid items-start gap-8 lg:grid-cols-2">
        <Card aria-labelledby="history-heading">
          <CardHeader id="history-heading" title="History" description="What got better or worse from one revision to the next." />
          <QueryView query={history} loadingLabel="Loading the history…" errorTitle="The history could not be loaded">
            {(entries) => <RevisionHistory entries={entries} currentRevisionId={revision.id} />}
          </QueryView>
        </Card>
        <div className="space-y-8">
          <Card aria-labelledby="downloads-heading">
            <CardHeader id="downloads-heading" title="Downloads" />
            <RevisionDownloads revision={revision} />
          </Card>
          <Card aria-labelledby="photos-heading">
            <CardHeader id="photos-heading" title="Photos" />
            <PhotoThumbnails revision={revision} />
          </Card>
        </div>
      </div>
    </div>
  );
}

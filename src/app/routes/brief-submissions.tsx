import { useState } from 'react';
import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { SubmissionsQuery } from '../../../shared/api/briefs.js';
import { Button, buttonClasses } from '../../components/ui/button.js';
import { Card } from '../../components/ui/card.js';
import { describeError } from '../../components/ui/error-state.js';
import { FormStatus, type FormStatusValue } from '../../components/ui/form-status.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { briefQueryOptions, useBrief } from '../../features/briefs/api/get-brief.js';
import { studioQueryOptions, useStudio } from '../../features/studios/api/get-studio.js';
import { submissionsExportUrl, submissionsQueryOptions, useSubmissions } from '../../features/submissions/api/get-submissions.js';
import { useReauditBrief } from '../../features/submissions/api/reaudit-brief.js';
import { SubmissionFilters, SubmissionsTable } from '../../features/submissions/components/submissions-table.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const briefId = parseIdParam(params.briefId, 'brief', '/briefs/1');
    const brief = await queryClient.ensureQueryData(briefQueryOptions(briefId));
    await queryClient.ensureQueryData(studioQueryOptions(brief.studioId));
    await Promise.allSettled([queryClient.ensureQueryData(submissionsQueryOptions(briefId, {}))]);
    return null;
  };
}

export function Component() {
  const briefId = parseIdParam(useParams().briefId, 'brief', '/briefs/1');
  const { data: brief } = useBrief(briefId);
  const { data: studio } = useStudio(brief.studioId);
  const { data: me } = useMe();
  // The server decides; this only hides what an assigned critic may not do.
  const manage = studio.myRole === 'instructor' || me?.globalRole === 'admin';
  const [filters, setFilters] = useState<SubmissionsQuery>({});
  const submissions = useSubmissions(briefId, filters);
  const reaudit = useReauditBrief(briefId);
  const [status, setStatus] = useState<FormStatusValue>(null);
  useDocumentTitle(`Submissions · ${brief.title}`);

  const runReaudit = async () => {
    setStatus(null);
    try {
      const { queued } = await reaudit.mutateAsync();
      setStatus({ kind: 'success', message: queued ? `Queued ${queued} latest ${queued === 1 ? 'revision' : 'revisions'} for a fresh audit.` : 'There is no revision to audit yet.' });
    } catch (error) {
      setStatus({ kind: 'error', message: describeError(error) });
    }
  };

  return (
    <div className="space-y-6">
      <PageHeader
        eyebrow={<Link to={`/briefs/${brief.id}`}>{brief.title}</Link>}
        title="Submissions"
        description={
          manage
            ? 'Each participant’s latest revision with its audit figures. The table updates by itself while audits run.'
            : 'The submissions assigned to you, with each latest revision’s audit figures.'
        }
        actions={
          manage ? (
            <>
              <Button variant="secondary" pending={reaudit.isPending} pendingLabel="Queuing…" onClick={() => void runReaudit()}>
                Re-audit all
              </Button>
              <a href={submissionsExportUrl(brief.id)} download className={buttonClasses('secondary')}>
                Export CSV
              </a>
            </>
          ) : undefined
        }
      />
      <FormStatus status={status} />
      <Card aria-label="Submissions table">
        <QueryView query={submissions} loadingLabel="Loading the submissions…" errorTitle="The submissions could not be loaded">
          {(rows) => (
            <SubmissionsTable
              rows={rows}
              toolbar={
                <div className="flex flex-wrap items-end gap-4">
                  <SubmissionFilters filters={filters} onChange={setFilters} />
                  <span role="status" className="pb-1.5 font-mono text-xs text-ink-soft">
                    {submissions.isPlaceholderData ? 'Updating…' : ''}
                  </span>
                </div>
              }
            />
          )}
        </QueryView>
      </Card>
    </div>
  );
}

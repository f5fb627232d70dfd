import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card, CardHeader } from '../../components/ui/card.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { briefChangesQueryOptions, useBriefChanges } from '../../features/briefs/api/get-brief-changes.js';
import { briefQueryOptions, useBrief } from '../../features/briefs/api/get-brief.js';
import { BriefChangelog } from '../../features/briefs/components/brief-changelog.js';
import { BriefStateBadge } from '../../features/briefs/components/brief-state-badge.js';
import { materialsQueryOptions } from '../../features/materials/api/get-materials.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { requireBriefWriter } from './brief-access.js';
import { BriefEditorFrame } from './brief-editor-frame.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const briefId = parseIdParam(params.briefId, 'brief', '/briefs/1');
    const brief = await queryClient.ensureQueryData(briefQueryOptions(briefId));
    await requireBriefWriter(queryClient, brief.studioId);
    await Promise.allSettled([
      queryClient.ensureQueryData(materialsQueryOptions()),
      brief.state !== 'draft' ? queryClient.ensureQueryData(briefChangesQueryOptions(briefId)) : null,
    ]);
    return null;
  };
}

export function Component() {
  const briefId = parseIdParam(useParams().briefId, 'brief', '/briefs/1');
  const { data: brief } = useBrief(briefId);
  const changes = useBriefChanges(briefId, brief.state !== 'draft');
  useDocumentTitle(`Edit ${brief.title}`);
  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow={<Link to={`/studios/${brief.studioId}`}>Studio</Link>}
        title={`Edit brief: ${brief.title}`}
        description={
          <span className="flex flex-wrap items-center gap-3">
            <BriefStateBadge state={brief.state} />
            <Link to={`/briefs/${brief.id}`}>Open the brief page</Link>
            {brief.state !== 'draft' ? <Link to={`/briefs/${brief.id}/submissions`}>Submissions</Link> : null}
          </span>
        }
      />
      <BriefEditorFrame studioId={brief.studioId} brief={brief} />
      {brief.state !== 'draft' ? (
        <Card aria-labelledby="changelog-heading">
          <CardHeader id="changelog-heading" title="Changelog" description="Every change since the brief was published; participants see it on the brief page." />
          <QueryView query={changes} loadingLabel="Loading the changelog…" errorTitle="The changelog could not be loaded">
            {(list) => <BriefChangelog changes={list} />}
          </QueryView>
        </Card>
      ) : null}
    </div>
  );
}

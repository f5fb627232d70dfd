import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../components/ui/page-header.js';
import { materialsQueryOptions } from '../../features/materials/api/get-materials.js';
import { useStudio } from '../../features/studios/api/get-studio.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { requireBriefWriter } from './brief-access.js';
import { BriefEditorFrame } from './brief-editor-frame.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const studioId = parseIdParam(params.studioId, 'studio', '/studios/1');
    await requireBriefWriter(queryClient, studioId);
    await Promise.allSettled([queryClient.ensureQueryData(materialsQueryOptions())]);
    return null;
  };
}

export function Component() {
  const studioId = parseIdParam(useParams().studioId, 'studio', '/studios/1');
  const { data: studio } = useStudio(studioId);
  useDocumentTitle(`New brief · ${studio.name}`);
  return (
    <div>
      <PageHeader
        eyebrow={<Link to={`/studios/${studioId}`}>{studio.name}</Link>}
        title="New brief"
        description="Write the brief, set its constraints and rubric, then save it as a draft or publish it to the studio."
      />
      <BriefEditorFrame studioId={studioId} brief={null} />
    </div>
  );
}

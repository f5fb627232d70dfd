import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { Feedback } from '../../../shared/api/critique.js';
import type { Submission } from '../../../shared/api/revisions.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { EmptyState } from '../../components/ui/empty-state.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { QueryView } from '../../components/ui/query-view.js';
import { BriefCrumbs } from '../../components/ui/brief-crumbs.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { briefQueryOptions } from '../../features/briefs/api/get-brief.js';
import { feedbackQueryOptions, useFeedback } from '../../features/feedback/api/get-feedback.js';
import { useReleaseFeedback } from '../../features/feedback/api/release-feedback.js';
import { useSaveFinalMark } from '../../features/feedback/api/save-final-mark.js';
import { useSaveScores } from '../../features/feedback/api/save-scores.js';
import { FinalMarkForm } from '../../features/feedback/components/final-mark-form.js';
import { ReleasePanel } from '../../features/feedback/components/release-panel.js';
import { ScoreSheetForm } from '../../features/feedback/components/score-sheet-form.js';
import { ScoreSheets } from '../../features/feedback/components/score-sheets.js';
import { formatWeighted } from '../../features/feedback/components/weighted.js';
import { submissionQueryOptions } from '../../features/revisions/api/get-submission.js';
import { studioQueryOptions, useStudio } from '../../features/studios/api/get-studio.js';
import { formatDateTime } from '../../lib/format.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { parseIdParam } from './route-params.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const submissionId = parseIdParam(params.submissionId, 'submission', '/submissions/1/feedback');
    const submission = await queryClient.ensureQueryData(submissionQueryOptions(submissionId));
    await queryClient.ensureQueryData(studioQueryOptions(submission.studioId));
    // The feedback may be refused (403); the page shows the server's message in its place.
    await Promise.allSettled([queryClient.ensureQueryData(briefQueryOptions(submission.briefId)), queryClient.ensureQueryData(feedbackQueryOptions(submissionId))]);
    return null;
  };
}

export function Component() {
  const submissionId = parseIdParam(useParams().submissionId, 'submission', '/submissions/1/feedback');
  const { data: submission } = useSuspenseQuery(submissionQueryOptions(submissionId));
  const { data: studio } = useStudio(submission.studioId);
  const brief = useQuery(briefQueryOptions(submission.briefId));
  const feedback = useFeedback(submissionId);
  const latest = submission.revisions.at(-1);
  useDocumentTitle(`Feedback · ${submission.participant.name}`);

  return (
    <div className="space-y-8">
      <PageHeader
        eyebrow={<BriefCrumbs studio={studio} briefId={submission.briefId} briefTitle={brief.data?.title ?? 'Brief'} />}
        title={`Feedback: ${submission.participant.name}`}
        description={
          <span className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
            {latest ? <Link to={`/revisions/${latest.id}`}>Latest: revision {latest.number}</Link> : <span>No revision yet</span>}
            {submission.critics.length ? <span>Critics: {submission.critics.map((c) => c.name).join(', ')}</span> : <span>No critics assigned</span>}
          </span>
        }
      />
      <QueryView query={feedback} loadingLabel="Loading the feedback…" errorTitle="The feedback could not be loaded">
        {(f) => <FeedbackBody feedback={f} submission={submission} />}
      </QueryView>
    </div>
  );
}

function NoRubric() {
  return <p className="text-sm text-ink-soft">This brief has no rubric, so there is nothing to score per criterion; only the final mark applies.</p>;
}

function FeedbackBody({ feedback, submission }: { feedback: Feedback; submission: Submission }) {
  const { data: me } = useMe();
  const saveScores = useSaveScores(submission.id);
  const saveMark = useSaveFinalMark(submission.id);
  const release = useReleaseFeedback(submission.id);
  const hasRubric = feedback.rubric.length > 0;
  const mine = me ? feedback.sheets.find((s) => s.scorer.id === me.id) : undefined;
  const isOwner = me?.id === submission.participant.id;

  // The participant (or anyone who may neither score nor mark): nothing until released.
  if (!feedback.canScore && !feedback.canMark) {
    if (!feedback.released) {
      return (
        <EmptyState title="Feedback has not been released yet">
          {isOwner ? 'Your instructor releases the mark, the summary and the critics’ sheets together; you get an e-mail when they do.' : 'The instructor has not released this feedback.'}
        </EmptyState>
      );
    }
    return (
      <>
        <Card aria-labelledby="final-heading">
          <CardHeader
            id="final-heading"
            title="Final mark"
            description={feedback.releasedAt ? <>Released {formatDateTime(feedback.releasedAt)}</> : undefined}
          />
          <p className="text-4xl font-semibold">
            {feedback.finalMark === null ? <span className="text-lg font-normal text-ink-soft">No final mark was given.</span> : <>{feedback.finalMark} <span className="text-lg font-normal text-ink-soft">/ 100</span></>}
          </p>
          {feedback.summary ? <p className="mt-4 max-w-prose whitespace-pre-line">{feedback.summary}</p> : null}
        </Card>
        <Card aria-labelledby="sheets-heading">
          <CardHeader id="sheets-heading" title="Score sheets" />
          {hasRubric ? <ScoreSheets rubric={feedback.rubric} sheets={feedback.sheets} /> : <NoRubric />}
        </Card>
      </>
    );
  }

  return (
    <>
      {feedback.canScore ? (
        <Card aria-labelledby="my-scores-heading">
          <CardHeader
            id="my-scores-heading"
            title="Your scores"
            description={
              mine ? (
                <>
                  Saved {formatDateTime(mine.updatedAt)} · weighted {formatWeighted(mine.weighted)}
                </>
              ) : (
                'Pick a level for each criterion you can judge and say why.'
              )
            }
          />
          {hasRubric && me ? (
            <ScoreSheetForm rubric={feedback.rubric} sheet={mine} scorerId={me.id} onSave={(body) => saveScores.mutateAsync(body)} />
          ) : (
            <NoRubric />
          )}
        </Card>
      ) : null}

      {feedback.canMark ? (
        <>
          <Card aria-labelledby="all-sheets-heading">
            <CardHeader id="all-sheets-heading" title="Every sheet" description="The critics’ and instructors’ scores side by side." />
            {hasRubric ? <ScoreSheets rubric={feedback.rubric} sheets={feedback.sheets} /> : <NoRubric />}
          </Card>
          <div className="grid items-start gap-8 lg:grid-cols-2">
            <Card aria-labelledby="mark-heading">
              <CardHeader id="mark-heading" title="Final mark and summary" />
              <FinalMarkForm feedback={feedback} onSave={(body) => saveMark.mutateAsync(body)} />
            </Card>
            <Card aria-labelledby="release-heading">
              <CardHeader id="release-heading" title="Release" />
              <ReleasePanel feedback={feedback} participantName={submission.participant.name} pending={release.isPending} onRelease={() => release.mutateAsync()} />
            </Card>
          </div>
        </>
      ) : feedback.released ? (
        <p className="text-sm text-ink-soft" role="status">
          The instructor released this feedback {feedback.releasedAt ? formatDateTime(feedback.releasedAt) : ''}.
        </p>
      ) : null}
    </>
  );
}

import { useState } from 'react';
import type { Feedback } from '../../../../shared/api/critique.js';
import { ConfirmAction } from '../../../components/ui/confirm-action.js';
import { describeError } from '../../../components/ui/error-state.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';
import { formatDateTime } from '../../../lib/format.js';

/**
 * Releasing the feedback to the participant, after a confirmation; once released it says when.
 * A release without a final mark is allowed but named in the question.
 */
export function ReleasePanel({
  feedback,
  participantName,
  onRelease,
  pending,
}: {
  feedback: Pick<Feedback, 'released' | 'releasedAt' | 'finalMark'>;
  participantName: string;
  onRelease: () => Promise<Feedback>;
  pending: boolean;
}) {
  const [status, setStatus] = useState<FormStatusValue>(null);
  if (feedback.released) {
    return (
      <p className="text-sm" role="status">
        Released {feedback.releasedAt ? <time dateTime={feedback.releasedAt}>at {formatDateTime(feedback.releasedAt)}</time> : null}. {participantName} can read the mark, the summary and every sheet.
      </p>
    );
  }
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-soft">{participantName} sees nothing of the feedback until you release it; they are told by e-mail.</p>
      <ConfirmAction
        label="Release feedback"
        variant="primary"
        question={
          <>
            Release the {feedback.finalMark === null ? 'summary (no final mark is set)' : `final mark ${feedback.finalMark}, the summary`} and every sheet to {participantName}?
          </>
        }
        confirmLabel="Yes, release"
        pendingLabel="Releasing…"
        pending={pending}
        onConfirm={async () => {
          setStatus(null);
          try {
            await onRelease();
          } catch (error) {
            setStatus({ kind: 'error', message: describeError(error) });
            throw error;
          }
        }}
      />
      <FormStatus status={status} />
    </div>
  );
}

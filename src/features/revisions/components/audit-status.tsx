import type { Audit } from '../../../../shared/api/revisions.js';
import { AuditStateBadge } from '../../../components/ui/audit-state-badge.js';
import { Button } from '../../../components/ui/button.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { describeError } from '../../../components/ui/error-state.js';
import { formatDateTime } from '../../../lib/format.js';
import { useRetryAudit } from '../api/retry-audit.js';

const WORDS = {
  queued: 'Waiting for a free worker. This page updates by itself.',
  running: 'The audit is running. This page updates by itself.',
  done: 'The audit is done.',
  failed: 'The audit could not finish.',
} as const;

/** The audit's live state in words; a failed audit says why and can be retried. */
export function AuditStatus({ revisionId, audit, canRetry }: { revisionId: number; audit: Audit; canRetry: boolean }) {
  const retry = useRetryAudit(revisionId);
  return (
    <div className="space-y-3" role="status" aria-live="polite">
      <div className="flex flex-wrap items-center gap-3">
        <AuditStateBadge state={audit.state} className="text-sm" />
        <span className="text-sm">{WORDS[audit.state]}</span>
      </div>
      <p className="font-mono text-xs text-ink-soft">
        Queued {formatDateTime(audit.queuedAt)}
        {audit.startedAt ? ` · started ${formatDateTime(audit.startedAt)}` : ''}
        {audit.finishedAt ? ` · finished ${formatDateTime(audit.finishedAt)}` : ''}
        {audit.attempts > 1 ? ` · attempt ${audit.attempts}` : ''}
      </p>
      {audit.state === 'failed' ? (
        <div className="space-y-2 rounded-md border border-signal-error/60 bg-signal-error-wash/50 px-3 py-2">
          <p className="text-sm">{audit.error ?? 'The audit stopped without saying why.'}</p>
          {canRetry ? (
            <Button variant="secondary" size="sm" pending={retry.isPending} pendingLabel="Queuing…" onClick={() => retry.mutate()}>
              Retry the audit
            </Button>
          ) : null}
          {retry.isError ? <FormStatus status={{ kind: 'error', message: describeError(retry.error) }} /> : null}
        </div>
      ) : null}
    </div>
  );
}

import type { AuditState } from '../../../../shared/api/briefs.js';

/** How often to ask about an audit still in the queue or running; null stops polling. */
export function auditPollInterval(state: AuditState | null | undefined): number | false {
  return state === 'queued' || state === 'running' ? 1500 : false;
}

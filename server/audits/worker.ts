/**
 * The audit task that runs in a worker thread (loaded through worker-entry.mjs, which registers
 * tsx first). One call audits one revision's design against its brief.
 */
import { auditAgainstBrief, type BriefAuditInput, type BriefAuditResult } from './brief-rules.js';

export default function runAudit(input: BriefAuditInput): BriefAuditResult {
  try {
    return auditAgainstBrief(input);
  } catch (e) {
    return { ok: false, error: `The audit stopped on an internal problem (${e instanceof Error ? e.message : String(e)}). Retry it; if it fails again, tell your instructor.` };
  }
}

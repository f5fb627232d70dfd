import type { Brief } from '../../../../shared/api/briefs.js';
import { describeConstraints, LATE_POLICY_WORDS } from './brief-words.js';

/** The brief's limits in plain sentences. */
export function ConstraintsSummary({ brief }: { brief: Brief }) {
  return (
    <ul className="list-disc space-y-1.5 pl-5 text-sm leading-relaxed">
      {describeConstraints(brief.constraints, brief.material).map((line) => (
        <li key={line}>{line}</li>
      ))}
      <li>{LATE_POLICY_WORDS[brief.latePolicy]}</li>
    </ul>
  );
}

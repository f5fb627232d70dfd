import type { InvitationPreview } from '../../../../shared/api/studios.js';
import { RoleBadge } from '../../../components/ui/role-badge.js';
import { formatDateTime } from '../../../lib/format.js';

export function InvitationSummary({ preview }: { preview: InvitationPreview }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-2 text-sm">
      <dt className="text-ink-soft">Studio</dt>
      <dd className="font-semibold">{preview.studioName}</dd>
      <dt className="text-ink-soft">Role</dt>
      <dd>
        <RoleBadge role={preview.role} />
      </dd>
      <dt className="text-ink-soft">Invited by</dt>
      <dd>{preview.invitedBy}</dd>
      <dt className="text-ink-soft">For</dt>
      <dd className="font-mono">{preview.email}</dd>
      <dt className="text-ink-soft">Link expires</dt>
      <dd className="font-mono">{formatDateTime(preview.expiresAt)}</dd>
    </dl>
  );
}

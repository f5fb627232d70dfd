import { useState } from 'react';
import type { Invitation } from '../../../../shared/api/studios.js';
import { Button } from '../../../components/ui/button.js';
import { describeError } from '../../../components/ui/error-state.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';
import { RoleBadge, StateBadge } from '../../../components/ui/role-badge.js';
import { formatDate, formatDateTime } from '../../../lib/format.js';
import { useRevokeInvitation } from '../api/revoke-invitation.js';

export function InvitationsList({ studioId, invitations }: { studioId: number; invitations: Invitation[] }) {
  const [status, setStatus] = useState<FormStatusValue>(null);
  const revoke = useRevokeInvitation(studioId);
  const pending = invitations
    .filter((i) => i.state === 'pending')
    .sort((a, b) => b.createdAt.localeCompare(a.createdAt));
  const past = invitations.length - pending.length;

  return (
    <div className="space-y-3">
      {pending.length === 0 ? (
        <p className="text-sm text-ink-soft">No invitations are waiting for an answer.</p>
      ) : (
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-paper-raised" aria-label="Pending invitations">
          {pending.map((invitation) => (
            <li key={invitation.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
              <div className="min-w-0 space-y-1">
                <p className="flex flex-wrap items-center gap-2">
                  <span className="font-mono text-sm">{invitation.email}</span>
                  <RoleBadge role={invitation.role} />
                </p>
                <p className="text-xs text-ink-soft">
                  Sent by {invitation.invitedBy} on {formatDate(invitation.createdAt)} · expires {formatDateTime(invitation.expiresAt)}
                </p>
              </div>
              <Button
                variant="danger"
                size="sm"
                aria-label={`Revoke the invitation to ${invitation.email}`}
                pending={revoke.isPending && revoke.variables === invitation.id}
                onClick={() => {
                  setStatus(null);
                  revoke.mutate(invitation.id, {
                    onSuccess: () => setStatus({ kind: 'success', message: `The invitation to ${invitation.email} was revoked; its link no longer works.` }),
                    onError: (error) => setStatus({ kind: 'error', message: `Not revoked: ${describeError(error)}` }),
                  });
                }}
              >
                Revoke
              </Button>
            </li>
          ))}
        </ul>
      )}
      {past > 0 ? (
        <p className="text-xs text-ink-soft">
          {past} earlier {past === 1 ? 'invitation was' : 'invitations were'} accepted, revoked or expired:{' '}
          {invitations
            .filter((i) => i.state !== 'pending')
            .slice(0, 5)
            .map((i) => (
              <span key={i.id} className="mr-2 inline-flex items-center gap-1">
                <span className="font-mono">{i.email}</span>
                <StateBadge tone={i.state === 'accepted' ? 'ok' : 'neutral'}>{i.state}</StateBadge>
              </span>
            ))}
        </p>
      ) : null}
      <FormStatus status={status} />
    </div>
  );
}

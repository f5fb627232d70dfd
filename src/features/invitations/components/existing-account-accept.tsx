import type { ReactNode } from 'react';
import type { SessionUser } from '../../../../shared/api/auth.js';
import type { InvitationPreview } from '../../../../shared/api/studios.js';
import { Button, ButtonLink } from '../../../components/ui/button.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { ROLE_LABELS } from '../../../components/ui/role-badge.js';
import { describeError } from '../../../components/ui/error-state.js';
import { signInPath } from '../../../lib/api-client.js';
import { useAcceptInvitation } from '../api/accept-invitation.js';

/**
 * For an address that already has an account: sign in as that address, then accept.
 * `signOutControl` is supplied by the page (signing out belongs to the auth feature).
 */
export function ExistingAccountAccept({
  token,
  preview,
  currentUser,
  signOutControl,
  onAccepted,
}: {
  token: string;
  preview: InvitationPreview;
  currentUser: SessionUser | null;
  signOutControl: ReactNode;
  onAccepted: (user: SessionUser) => void;
}) {
  const accept = useAcceptInvitation(token);
  const here = `/invitations/${encodeURIComponent(token)}`;

  if (!currentUser) {
    return (
      <div className="space-y-4">
        <p>
          An account for <span className="font-mono">{preview.email}</span> already exists. Sign in with it, and you
          come back here to accept.
        </p>
        <ButtonLink variant="primary" to={`${signInPath(here)}&email=${encodeURIComponent(preview.email)}`}>
          Sign in to accept
        </ButtonLink>
      </div>
    );
  }

  if (currentUser.email.toLowerCase() !== preview.email.toLowerCase()) {
    return (
      <div className="space-y-4">
        <p>
          You are signed in as <span className="font-mono">{currentUser.email}</span>, but this invitation is for{' '}
          <span className="font-mono">{preview.email}</span>. Sign out, then sign in with the invited address.
        </p>
        {signOutControl}
      </div>
    );
  }

  const already = currentUser.memberships.some((m) => m.studioName === preview.studioName && m.role === preview.role);

  return (
    <div className="space-y-4">
      <p>
        Signed in as <span className="font-mono">{currentUser.email}</span>.
        {already ? ' You already hold this role in a studio of that name; accepting changes nothing there.' : null}
      </p>
      <FormStatus
        status={accept.isError ? { kind: 'error', message: `The invitation was not accepted: ${describeError(accept.error)}` } : null}
      />
      <Button pending={accept.isPending} pendingLabel="Joining…" onClick={() => accept.mutate({}, { onSuccess: onAccepted })}>
        Join {preview.studioName} as {ROLE_LABELS[preview.role].toLowerCase()}
      </Button>
    </div>
  );
}

import type { QueryClient } from '@tanstack/react-query';
import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { SessionUser } from '../../../shared/api/auth.js';
import { ButtonLink } from '../../components/ui/button.js';
import { Card } from '../../components/ui/card.js';
import { ROLE_LABELS } from '../../components/ui/role-badge.js';
import { authKeys } from '../../features/auth/api/keys.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { invitationPreviewQueryOptions, useInvitationPreview } from '../../features/invitations/api/get-invitation-preview.js';
import { ExistingAccountAccept } from '../../features/invitations/components/existing-account-accept.js';
import { InvitationSummary } from '../../features/invitations/components/invitation-summary.js';
import { NewAccountForm } from '../../features/invitations/components/new-account-form.js';
import { studioKeys } from '../../features/studios/api/keys.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { SignOutButton } from '../layout/top-bar.js';
import { AuthFrame } from './auth-frame.js';

export function makeLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(invitationPreviewQueryOptions(params.token ?? ''));
    return null;
  };
}

export function Component() {
  const token = useParams().token ?? '';
  const { data: lookup } = useInvitationPreview(token);
  const { data: me } = useMe();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  useDocumentTitle(lookup.state === 'open' ? `Invitation to ${lookup.preview.studioName}` : 'Invitation');

  if (lookup.state !== 'open') {
    const unknown = lookup.state === 'unknown';
    return (
      <AuthFrame title={unknown ? 'This invitation link is not known' : 'This invitation can no longer be used'}>
        <div className="space-y-4">
          <p>
            {lookup.message ||
              (unknown
                ? 'No invitation matches this link.'
                : 'The link has expired, was revoked, or has already been used. Invitation links work once.')}
          </p>
          <p className="text-sm text-ink-soft">
            {unknown
              ? 'Check that the whole address from the e-mail was opened; links that wrap across lines sometimes lose their end. '
              : null}
            If you still need to join, ask the instructor who invited you for a new invitation.
          </p>
          <ButtonLink to={me ? '/' : '/sign-in'}>{me ? 'Go to my studios' : 'Go to sign in'}</ButtonLink>
        </div>
      </AuthFrame>
    );
  }

  const { preview } = lookup;
  const onAccepted = (user: SessionUser) => {
    queryClient.setQueryData(authKeys.me(), user);
    void queryClient.invalidateQueries({ queryKey: studioKeys.all });
    const joined = [...user.memberships].reverse().find((m) => m.studioName === preview.studioName);
    navigate(joined ? `/studios/${joined.studioId}` : '/', { replace: true });
  };

  return (
    <AuthFrame
      title={`Join ${preview.studioName}`}
      lead={`${preview.invitedBy} invited you to this studio as ${ROLE_LABELS[preview.role].toLowerCase()}.`}
      aside={
        <Card className="p-4 sm:p-5" aria-label="Invitation details">
          <InvitationSummary preview={preview} />
        </Card>
      }
    >
      {preview.accountExists ? (
        <ExistingAccountAccept
          token={token}
          preview={preview}
          currentUser={me}
          signOutControl={
            <SignOutButton size="md" to={`/sign-in?next=${encodeURIComponent(`/invitations/${token}`)}&email=${encodeURIComponent(preview.email)}`} />
          }
          onAccepted={onAccepted}
        />
      ) : (
        <>
          {me ? (
            <p className="mb-4 rounded-md border border-rule bg-paper-sunk/60 px-3 py-2 text-sm">
              You are signed in as <span className="font-mono">{me.email}</span>. This invitation is for a new account
              for <span className="font-mono">{preview.email}</span>; sign out first if that is not you.
            </p>
          ) : null}
          <NewAccountForm token={token} email={preview.email} studioName={preview.studioName} onAccepted={onAccepted} />
        </>
      )}
    </AuthFrame>
  );
}

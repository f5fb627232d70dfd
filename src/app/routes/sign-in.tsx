import { useNavigate, useSearchParams } from 'react-router-dom';
import { ButtonLink } from '../../components/ui/button.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { SignInForm } from '../../features/auth/components/sign-in-form.js';
import { safeNextPath } from '../../lib/api-client.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { SignOutButton } from '../layout/top-bar.js';
import { AuthFrame, ProductNote } from './auth-frame.js';

export function Component() {
  useDocumentTitle('Sign in');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const next = safeNextPath(params.get('next'));
  const cameFromElsewhere = params.has('next');

  if (me) {
    return (
      <AuthFrame title="You are signed in" aside={<ProductNote />}>
        <p className="mb-5">
          Signed in as <span className="font-medium">{me.name}</span> (<span className="font-mono">{me.email}</span>).
        </p>
        <div className="flex flex-wrap gap-3">
          <ButtonLink variant="primary" to={next}>
            Continue
          </ButtonLink>
          <SignOutButton size="md" />
        </div>
      </AuthFrame>
    );
  }

  return (
    <AuthFrame
      title="Sign in"
      lead={cameFromElsewhere ? 'Sign in to continue where you were going.' : 'Use the e-mail address your maker space knows you by.'}
      aside={
        <>
          <ProductNote />
          <p>
            New here? Accounts start from an invitation: an instructor sends you a link by e-mail.
          </p>
        </>
      }
    >
      <SignInForm defaultEmail={params.get('email') ?? ''} onSignedIn={() => navigate(next, { replace: true })} />
    </AuthFrame>
  );
}

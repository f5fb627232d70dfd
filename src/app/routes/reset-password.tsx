import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { ButtonLink } from '../../components/ui/button.js';
import { ResetPasswordForm } from '../../features/auth/components/reset-password-form.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { AuthFrame } from './auth-frame.js';

export function Component() {
  useDocumentTitle('Choose a new password');
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const [done, setDone] = useState(false);

  if (!token) {
    return (
      <AuthFrame title="This reset link is incomplete">
        <p className="mb-4">
          The address has no reset token. Open the link from the e-mail exactly as it was sent, or ask for a new one.
        </p>
        <ButtonLink to="/forgot-password" variant="primary">
          Ask for a new link
        </ButtonLink>
      </AuthFrame>
    );
  }

  if (done) {
    return (
      <AuthFrame title="Password changed">
        <p role="status" className="mb-5">
          Your new password is set. The link cannot be used again.
        </p>
        <ButtonLink to="/sign-in" variant="primary">
          Sign in
        </ButtonLink>
      </AuthFrame>
    );
  }

  return (
    <AuthFrame
      title="Choose a new password"
      lead="The link works once and expires an hour after it was sent."
      aside={
        <p>
          Link expired? <Link to="/forgot-password">Ask for a new one</Link>
        </p>
      }
    >
      <ResetPasswordForm token={token} onDone={() => setDone(true)} />
    </AuthFrame>
  );
}

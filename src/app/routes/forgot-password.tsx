import { Link, useSearchParams } from 'react-router-dom';
import { ForgotPasswordForm } from '../../features/auth/components/forgot-password-form.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';
import { AuthFrame } from './auth-frame.js';

export function Component() {
  useDocumentTitle('Reset your password');
  const [params] = useSearchParams();
  return (
    <AuthFrame
      title="Reset your password"
      lead="Enter the address you sign in with. We send a link that lets you choose a new password."
      aside={
        <p>
          Remembered it? <Link to="/sign-in">Back to sign in</Link>
        </p>
      }
    >
      <ForgotPasswordForm defaultEmail={params.get('email') ?? ''} />
    </AuthFrame>
  );
}

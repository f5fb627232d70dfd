import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { loginBodySchema, type LoginBody, type SessionUser } from '../../../../shared/api/auth.js';
import { Button } from '../../../components/ui/button.js';
import { TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useSignIn } from '../api/sign-in.js';

export function SignInForm({
  defaultEmail = '',
  onSignedIn,
}: {
  defaultEmail?: string;
  onSignedIn: (user: SessionUser) => void;
}) {
  const form = useForm<LoginBody>({
    resolver: zodResolver(loginBodySchema),
    defaultValues: { email: defaultEmail, password: '' },
  });
  const { register, handleSubmit, formState, watch } = form;
  const { status, fail, clear } = useSubmitStatus(form);
  const signIn = useSignIn();
  const email = watch('email');

  const onSubmit = handleSubmit(async (values) => {
    clear();
    try {
      const user = await signIn.mutateAsync(values);
      onSignedIn(user);
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Sign in">
      <TextField
        label="E-mail"
        type="email"
        autoComplete="username"
        autoFocus
        error={formState.errors.email?.message}
        {...register('email')}
      />
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={formState.errors.password?.message}
        {...register('password')}
      />
      <FormStatus status={status} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" pending={signIn.isPending} pendingLabel="Signing in…">
          Sign in
        </Button>
        <Link to={email ? `/forgot-password?email=${encodeURIComponent(email)}` : '/forgot-password'} className="text-sm">
          Forgot your password?
        </Link>
      </div>
    </form>
  );
}

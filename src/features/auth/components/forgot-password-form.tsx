import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { resetRequestBodySchema, type ResetRequestBody } from '../../../../shared/api/auth.js';
import { Button } from '../../../components/ui/button.js';
import { TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useRequestPasswordReset } from '../api/request-password-reset.js';

export function ForgotPasswordForm({ defaultEmail = '' }: { defaultEmail?: string }) {
  const form = useForm<ResetRequestBody>({
    resolver: zodResolver(resetRequestBodySchema),
    defaultValues: { email: defaultEmail },
  });
  const { register, handleSubmit, formState } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const request = useRequestPasswordReset();

  const onSubmit = handleSubmit(async (values) => {
    clear();
    try {
      await request.mutateAsync(values);
      succeed(
        `If ${values.email} has an account, a reset link is on its way. The link works once and expires after an hour.`,
      );
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Request a password reset">
      <TextField
        label="E-mail"
        type="email"
        autoComplete="email"
        autoFocus
        error={formState.errors.email?.message}
        {...register('email')}
      />
      <FormStatus status={status} />
      <Button type="submit" pending={request.isPending} pendingLabel="Sending…">
        Send reset link
      </Button>
    </form>
  );
}

import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { passwordSchema } from '../../../../shared/api/common.js';
import { Button } from '../../../components/ui/button.js';
import { TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useConfirmPasswordReset } from '../api/confirm-password-reset.js';

const newPasswordSchema = z
  .object({ password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ' });
type NewPassword = z.infer<typeof newPasswordSchema>;

export function ResetPasswordForm({ token, onDone }: { token: string; onDone: () => void }) {
  const form = useForm<NewPassword>({
    resolver: zodResolver(newPasswordSchema),
    defaultValues: { password: '', repeat: '' },
  });
  const { register, handleSubmit, formState } = form;
  const { status, fail, clear } = useSubmitStatus(form);
  const confirm = useConfirmPasswordReset();

  const onSubmit = handleSubmit(async ({ password }) => {
    clear();
    try {
      await confirm.mutateAsync({ token, password });
      onDone();
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Set a new password">
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={formState.errors.password?.message}
        {...register('password')}
      />
      <TextField
        label="Repeat the new password"
        type="password"
        autoComplete="new-password"
        error={formState.errors.repeat?.message}
        {...register('repeat')}
      />
      <FormStatus status={status} />
      <Button type="submit" pending={confirm.isPending} pendingLabel="Saving…">
        Set new password
      </Button>
    </form>
  );
}

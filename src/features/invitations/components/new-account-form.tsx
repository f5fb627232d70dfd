import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { SessionUser } from '../../../../shared/api/auth.js';
import { passwordSchema, personNameSchema } from '../../../../shared/api/common.js';
import { Button } from '../../../components/ui/button.js';
import { TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useAcceptInvitation } from '../api/accept-invitation.js';

const newAccountSchema = z
  .object({ name: personNameSchema, password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'The two passwords differ' });
type NewAccountInput = z.input<typeof newAccountSchema>;
type NewAccount = z.output<typeof newAccountSchema>;

export function NewAccountForm({
  token,
  email,
  studioName,
  onAccepted,
}: {
  token: string;
  email: string;
  studioName: string;
  onAccepted: (user: SessionUser) => void;
}) {
  const form = useForm<NewAccountInput, unknown, NewAccount>({
    resolver: zodResolver(newAccountSchema),
    defaultValues: { name: '', password: '', repeat: '' },
  });
  const { register, handleSubmit, formState } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const accept = useAcceptInvitation(token);

  const onSubmit = handleSubmit(async ({ name, password }) => {
    clear();
    try {
      const user = await accept.mutateAsync({ name, password });
      succeed(`Account created. Welcome to ${studioName}.`);
      onAccepted(user);
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Create your account" className="space-y-5">
      <TextField label="E-mail" type="email" value={email} readOnly autoComplete="username" hint="The address the invitation was sent to." />
      <TextField label="Your name" autoComplete="name" autoFocus error={formState.errors.name?.message} {...register('name')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters."
        error={formState.errors.password?.message}
        {...register('password')}
      />
      <TextField
        label="Repeat the password"
        type="password"
        autoComplete="new-password"
        error={formState.errors.repeat?.message}
        {...register('repeat')}
      />
      <FormStatus status={status} />
      <Button type="submit" pending={accept.isPending} pendingLabel="Creating account…">
        Create account and join
      </Button>
    </form>
  );
}

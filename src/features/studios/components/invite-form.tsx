import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { STUDIO_ROLES } from '../../../../shared/api/roles.js';
import { inviteBodySchema, type InviteBody } from '../../../../shared/api/studios.js';
import { Button } from '../../../components/ui/button.js';
import { SelectField, TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { ROLE_LABELS } from '../../../components/ui/role-badge.js';
import { formatDateTime } from '../../../lib/format.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useCreateInvitation } from '../api/create-invitation.js';

export function InviteForm({ studioId, studioName }: { studioId: number; studioName: string }) {
  const form = useForm<InviteBody>({
    resolver: zodResolver(inviteBodySchema),
    defaultValues: { email: '', role: 'participant' },
  });
  const { register, handleSubmit, formState, reset } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const invite = useCreateInvitation(studioId);

  const onSubmit = handleSubmit(async (values) => {
    clear();
    try {
      const invitation = await invite.mutateAsync(values);
      reset({ email: '', role: values.role });
      succeed(
        `Invitation sent to ${invitation.email} to join ${studioName} as ${ROLE_LABELS[invitation.role].toLowerCase()}. The link works once and expires ${formatDateTime(invitation.expiresAt)}.`,
      );
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Invite someone" className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <TextField
          label="E-mail address"
          type="email"
          autoComplete="off"
          placeholder="name@example.org"
          error={formState.errors.email?.message}
          {...register('email')}
        />
        <SelectField label="Role in this studio" error={formState.errors.role?.message} {...register('role')}>
          {STUDIO_ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_LABELS[role]}
            </option>
          ))}
        </SelectField>
      </div>
      <FormStatus status={status} />
      <Button type="submit" pending={invite.isPending} pendingLabel="Sending…">
        Send invitation
      </Button>
    </form>
  );
}

import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { useState } from 'react';
import { createStudioBodySchema, type CreateStudioBody, type Studio } from '../../../../shared/api/studios.js';
import { Button } from '../../../components/ui/button.js';
import { TextAreaField, TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useCreateStudio } from '../api/create-studio.js';

export function CreateStudioForm() {
  const form = useForm<CreateStudioBody>({
    resolver: zodResolver(createStudioBodySchema),
    defaultValues: { name: '', description: '' },
  });
  const { register, handleSubmit, formState, reset } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const [created, setCreated] = useState<Studio | null>(null);
  const create = useCreateStudio();

  const onSubmit = handleSubmit(async (values) => {
    clear();
    setCreated(null);
    try {
      const studio = await create.mutateAsync(values);
      reset();
      setCreated(studio);
      succeed(`Studio “${studio.name}” was created. Open it to invite its first instructor.`);
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Create a studio" className="space-y-4">
      <TextField label="Studio name" autoComplete="off" error={formState.errors.name?.message} {...register('name')} />
      <TextAreaField
        label="Description"
        hint="Optional: who it is for, the term, the room."
        rows={3}
        error={formState.errors.description?.message}
        {...register('description')}
      />
      <FormStatus status={status} />
      {created ? (
        <p className="text-sm">
          <Link to={`/studios/${created.id}`}>Open {created.name}</Link>
        </p>
      ) : null}
      <Button type="submit" pending={create.isPending} pendingLabel="Creating…">
        Create studio
      </Button>
    </form>
  );
}

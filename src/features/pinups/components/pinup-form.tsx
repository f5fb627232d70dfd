import { useId } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { createPinupBodySchema, type Pinup } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { localDateTimeSchema } from '../../../lib/form-dates.js';
import { toLocalInput } from '../../../lib/format.js';
import { formErrorMap, numberField } from '../../../lib/form-numbers.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { RunningOrderEditor, type RunningOrderOption } from './running-order-editor.js';

/**
 * The schedule form: the shared create schema, with the start as a local date-time (what a
 * `datetime-local` box holds) turned into an ISO instant, and every field explicit so an edit
 * sends the whole session.
 */
export const pinupFormSchema = z.object({
  title: createPinupBodySchema.shape.title,
  startsAt: localDateTimeSchema,
  durationMinutes: z.number().int('Use whole minutes').min(10, 'At least 10 minutes').max(600, 'At most 600 minutes'),
  room: z.string().trim().max(200, 'Use at most 200 characters'),
  submissionIds: z
    .array(z.number().int().positive())
    .max(200, 'At most 200 entries')
    .refine((ids) => new Set(ids).size === ids.length, 'A submission appears at most once'),
});
export type PinupFormValues = z.input<typeof pinupFormSchema>;
export type PinupFormOutput = z.output<typeof pinupFormSchema>;

/** The form's values for an existing session (edit), or a fresh one starting tomorrow at 14:00. */
export function pinupFormDefaults(pinup?: Pinup, now: Date = new Date()): PinupFormValues {
  if (pinup) {
    return {
      title: pinup.title,
      startsAt: toLocalInput(pinup.startsAt),
      durationMinutes: pinup.durationMinutes,
      room: pinup.room,
      submissionIds: [...pinup.entries].sort((a, b) => a.position - b.position).map((e) => e.submissionId),
    };
  }
  const start = new Date(now.getFullYear(), now.getMonth(), now.getDate() + 1, 14, 0);
  return { title: '', startsAt: toLocalInput(start.toISOString()), durationMinutes: 90, room: '', submissionIds: [] };
}

/**
 * Schedules or edits a pin-up. `onSave` sends the values (the caller picks create or update) and
 * resolves with the saved session; the server's field messages land at their fields.
 */
export function PinupForm({
  pinup,
  options,
  onSave,
  onCancel,
  submitLabel,
  pendingLabel = 'Saving…',
  ariaLabel,
}: {
  pinup?: Pinup;
  options: RunningOrderOption[];
  onSave: (values: PinupFormOutput) => Promise<Pinup>;
  onCancel?: () => void;
  submitLabel: string;
  pendingLabel?: string;
  ariaLabel: string;
}) {
  const form = useForm<PinupFormValues, unknown, PinupFormOutput>({
    resolver: zodResolver(pinupFormSchema, { error: formErrorMap }),
    defaultValues: pinupFormDefaults(pinup),
  });
  const { register, handleSubmit, formState, control, reset } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const orderLabelId = useId();
  const timeZone = Intl.DateTimeFormat().resolvedOptions().timeZone;

  const onSubmit = handleSubmit(async (values) => {
    clear();
    try {
      const saved = await onSave(values);
      if (!pinup) reset(pinupFormDefaults());
      succeed(pinup ? `Saved “${saved.title}”.` : `Scheduled “${saved.title}” with ${saved.entries.length} ${saved.entries.length === 1 ? 'entry' : 'entries'}.`);
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label={ariaLabel} className="space-y-4">
      <TextField label="Title" error={formState.errors.title?.message} placeholder="Mid-brief pin-up" {...register('title')} />
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Starts"
          type="datetime-local"
          hint={`Your local time${timeZone ? ` (${timeZone})` : ''}`}
          error={formState.errors.startsAt?.message}
          {...register('startsAt')}
        />
        <TextField label="Duration (minutes)" inputMode="numeric" error={formState.errors.durationMinutes?.message} {...register('durationMinutes', numberField)} />
        <TextField label="Room" placeholder="Workshop 2" error={formState.errors.room?.message} {...register('room')} />
      </div>
      <fieldset className="space-y-2">
        <legend id={orderLabelId} className="text-sm font-medium">
          Running order
        </legend>
        <Controller
          control={control}
          name="submissionIds"
          render={({ field, fieldState }) => (
            <RunningOrderEditor value={field.value} onChange={field.onChange} options={options} error={fieldState.error?.message} labelId={orderLabelId} />
          )}
        />
      </fieldset>
      <FormStatus status={status} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={formState.isSubmitting} pendingLabel={pendingLabel}>
          {submitLabel}
        </Button>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}

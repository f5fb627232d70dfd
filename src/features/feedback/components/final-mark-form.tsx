import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { putFeedbackBodySchema, type Feedback } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { TextAreaField, TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { formErrorMap, nullableNumberField } from '../../../lib/form-numbers.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';

/** The shared body schema, with a summary limit that says so. */
export const finalMarkFormSchema = putFeedbackBodySchema.extend({
  summary: z.string().trim().max(10_000, 'Use at most 10000 characters'),
});
export type FinalMarkFormValues = z.input<typeof finalMarkFormSchema>;
export type FinalMarkFormOutput = z.output<typeof finalMarkFormSchema>;

/** The instructor's final mark (0–100, may stay empty) and a summary for the participant. */
export function FinalMarkForm({ feedback, onSave }: { feedback: Pick<Feedback, 'finalMark' | 'summary'>; onSave: (body: FinalMarkFormOutput) => Promise<Feedback> }) {
  const form = useForm<FinalMarkFormValues, unknown, FinalMarkFormOutput>({
    resolver: zodResolver(finalMarkFormSchema, { error: formErrorMap }),
    defaultValues: { finalMark: feedback.finalMark, summary: feedback.summary },
  });
  const { register, handleSubmit, formState } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);

  const onSubmit = handleSubmit(async (body) => {
    clear();
    try {
      const saved = await onSave(body);
      succeed(saved.finalMark === null ? 'Summary saved; no final mark yet.' : `Final mark ${saved.finalMark} saved.`);
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Final mark and summary" className="space-y-4">
      <TextField
        label="Final mark (0–100)"
        inputMode="decimal"
        containerClassName="max-w-48"
        hint="Leave empty until you decide."
        error={formState.errors.finalMark?.message}
        {...register('finalMark', nullableNumberField)}
      />
      <TextAreaField label="Summary for the participant" rows={5} error={formState.errors.summary?.message} {...register('summary')} />
      <FormStatus status={status} />
      <Button type="submit" pending={formState.isSubmitting} pendingLabel="Saving…">
        Save mark and summary
      </Button>
    </form>
  );
}

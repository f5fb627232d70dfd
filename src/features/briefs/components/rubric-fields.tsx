import { useFieldArray, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { Button } from '../../../components/ui/button.js';
import { TextField } from '../../../components/ui/field.js';
import { numberField } from '../../../lib/form-numbers.js';

type Msg = { message?: string } | undefined;
type CriterionErrors = {
  id?: Msg;
  criterion?: Msg;
  weight?: Msg;
  levels?: Array<{ score?: Msg; label?: Msg; descriptor?: Msg } | undefined> & { message?: string; root?: { message?: string } };
};

function LevelsFields({
  index,
  control,
  register,
  errors,
}: {
  index: number;
  control: Control<any>;
  register: UseFormRegister<any>;
  errors: CriterionErrors | undefined;
}) {
  const levels = useFieldArray({ control, name: `rubric.${index}.levels` as never });
  const levelErrors = errors?.levels;
  return (
    <div className="space-y-2">
      <p className="text-sm font-medium">Levels</p>
      {levels.fields.map((field, j) => (
        <div key={field.id} className="grid gap-2 sm:grid-cols-[6rem_12rem_minmax(0,1fr)_auto]">
          <TextField
            label={`Level ${j + 1} score`}
            inputMode="decimal"
            error={levelErrors?.[j]?.score?.message}
            {...register(`rubric.${index}.levels.${j}.score` as never, numberField)}
          />
          <TextField label={`Level ${j + 1} label`} error={levelErrors?.[j]?.label?.message} {...register(`rubric.${index}.levels.${j}.label` as never)} />
          <TextField
            label={`Level ${j + 1} descriptor`}
            error={levelErrors?.[j]?.descriptor?.message}
            {...register(`rubric.${index}.levels.${j}.descriptor` as never)}
          />
          <Button variant="quiet" size="sm" className="self-end" onClick={() => levels.remove(j)} aria-label={`Remove level ${j + 1} of criterion ${index + 1}`}>
            Remove
          </Button>
        </div>
      ))}
      {levelErrors?.message || levelErrors?.root?.message ? (
        <p className="text-sm text-signal-error">{levelErrors.message ?? levelErrors.root?.message}</p>
      ) : null}
      <Button
        variant="secondary"
        size="sm"
        onClick={() => levels.append({ score: levels.fields.length + 1, label: '', descriptor: '' } as never)}
        aria-label={`Add a level to criterion ${index + 1}`}
      >
        Add a level
      </Button>
    </div>
  );
}

/** The rubric: criteria with relative weights, each with scored levels and what the work looks like there. */
export function RubricFields({
  control,
  register,
  errors,
}: {
  control: Control<any>;
  register: UseFormRegister<any>;
  errors: FieldErrors<any>;
}) {
  // The criterion's own `id` is a form value, so the list's React keys live under another name.
  const criteria = useFieldArray({ control, name: 'rubric' as never, keyName: 'fieldKey' as never });
  const rubricErrors = errors.rubric as unknown as (CriterionErrors | undefined)[] & { message?: string; root?: { message?: string } } | undefined;

  const nextId = () => `c${Date.now().toString(36)}${Math.random().toString(36).slice(2, 5)}`;

  return (
    <div className="space-y-4">
      {criteria.fields.length === 0 ? <p className="text-sm text-ink-soft">No criteria yet. Critics score each criterion at one of its levels.</p> : null}
      {criteria.fields.map((field, i) => (
        <div key={(field as unknown as { fieldKey: string }).fieldKey} role="group" aria-label={`Criterion ${i + 1}`} className="space-y-3 rounded-md border border-rule bg-paper/50 p-3">
          <div className="grid gap-3 sm:grid-cols-[minmax(0,1fr)_8rem_auto]">
            <TextField label={`Criterion ${i + 1} name`} error={rubricErrors?.[i]?.criterion?.message ?? rubricErrors?.[i]?.id?.message} {...register(`rubric.${i}.criterion` as never)} />
            <TextField label={`Criterion ${i + 1} weight`} inputMode="decimal" error={rubricErrors?.[i]?.weight?.message} {...register(`rubric.${i}.weight` as never, numberField)} />
            <Button variant="quiet" size="sm" className="self-end" onClick={() => criteria.remove(i)} aria-label={`Remove criterion ${i + 1}`}>
              Remove
            </Button>
          </div>
          <LevelsFields index={i} control={control} register={register} errors={rubricErrors?.[i]} />
        </div>
      ))}
      {rubricErrors?.message || rubricErrors?.root?.message ? (
        <p className="text-sm text-signal-error">{rubricErrors.message ?? rubricErrors.root?.message}</p>
      ) : null}
      <Button
        variant="secondary"
        size="sm"
        onClick={() =>
          criteria.append({
            id: nextId(),
            criterion: '',
            weight: 1,
            levels: [
              { score: 1, label: 'Beginning', descriptor: '' },
              { score: 2, label: 'Developing', descriptor: '' },
              { score: 3, label: 'Accomplished', descriptor: '' },
            ],
          } as never)
        }
      >
        Add a criterion
      </Button>
    </div>
  );
}

import { useFieldArray, useWatch, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { Button } from '../../../components/ui/button.js';
import { SelectField, TextField } from '../../../components/ui/field.js';
import { numberField } from '../../../lib/form-numbers.js';
import { emptyFamilyRule } from './brief-form-schema.js';
import { groupsWithoutFold } from './brief-words.js';

type ListName = 'constraints.requiredFamilies' | 'constraints.allowedFamilies';

type RuleErrors = {
  message?: string;
  group?: { message?: string };
  axis?: { message?: string };
  normal?: { message?: string } & Array<{ message?: string } | undefined>;
  offsetMin?: { message?: string };
  offsetMax?: { message?: string };
};

/**
 * The family rules of a brief: each rule names a plane by the fold of an axis or by a normal,
 * optionally for one group only, with the offset range allowed.
 */
export function FamilyRulesFields({
  name,
  title,
  description,
  control,
  register,
  errors,
  groups,
}: {
  name: ListName;
  title: string;
  description: string;
  control: Control<any>;
  register: UseFormRegister<any>;
  errors: FieldErrors<any>;
  groups: string[];
}) {
  const list = useFieldArray({ control, name: name as never });
  const rules = useWatch({ control, name: name as never }) as unknown as Array<{ mode?: string; group?: string; axis?: number }> | undefined;
  const key = name === 'constraints.requiredFamilies' ? 'requiredFamilies' : 'allowedFamilies';
  const listErrors = (errors.constraints as Record<string, unknown> | undefined)?.[key] as (RuleErrors | undefined)[] & { message?: string } | undefined;
  const noun = key === 'requiredFamilies' ? 'Required family' : 'Allowed family';

  return (
    <fieldset className="space-y-3">
      <legend className="text-sm font-medium">{title}</legend>
      <p className="text-sm text-ink-soft">{description}</p>
      {list.fields.map((field, i) => {
        const e = listErrors?.[i];
        const mode = rules?.[i]?.mode === 'normal' ? 'normal' : 'axis';
        const fold = Number(rules?.[i]?.axis);
        const ruleGroup = rules?.[i]?.group;
        const lacking = mode === 'axis' && Number.isInteger(fold) && fold > 0 ? groupsWithoutFold(ruleGroup ? [ruleGroup] : groups, fold) : [];
        const base = `${name}.${i}` as const;
        return (
          <div key={field.id} role="group" aria-label={`${noun} ${i + 1}`} className="space-y-3 rounded-md border border-rule bg-paper/50 p-3">
            <div className="flex flex-wrap items-end gap-3">
              <SelectField label={`${noun} ${i + 1}: group`} containerClassName="w-52" error={e?.group?.message} {...register(`${base}.group` as never)}>
                <option value="">Any allowed group</option>
                {groups.map((g) => (
                  <option key={g} value={g}>
                    {g}
                  </option>
                ))}
              </SelectField>
              <fieldset className="space-y-1">
                <legend className="text-sm font-medium">Plane given by</legend>
                <div className="flex gap-3 pt-1.5">
                  <label className="inline-flex items-center gap-1.5 text-sm">
                    <input type="radio" value="axis" className="accent-accent" {...register(`${base}.mode` as never)} />
                    Fold of an axis
                  </label>
                  <label className="inline-flex items-center gap-1.5 text-sm">
                    <input type="radio" value="normal" className="accent-accent" {...register(`${base}.mode` as never)} />
                    Normal
                  </label>
                </div>
              </fieldset>
              <Button variant="quiet" size="sm" className="ml-auto" onClick={() => list.remove(i)} aria-label={`Remove ${noun.toLowerCase()} ${i + 1}`}>
                Remove
              </Button>
            </div>
            <div className="flex flex-wrap items-start gap-3">
              {mode === 'axis' ? (
                <TextField
                  label="Fold (2, 3, 4, 5 or n)"
                  inputMode="numeric"
                  containerClassName="w-48"
                  error={e?.axis?.message}
                  {...register(`${base}.axis` as never, numberField)}
                />
              ) : (
                (['x', 'y', 'z'] as const).map((axis, k) => (
                  <TextField
                    key={axis}
                    label={`Normal ${axis}`}
                    inputMode="decimal"
                    containerClassName="w-28"
                    error={k === 0 ? (e?.normal?.message ?? e?.normal?.[0]?.message ?? e?.axis?.message) : e?.normal?.[k]?.message}
                    {...register(`${base}.normal.${k}` as never, numberField)}
                  />
                ))
              )}
              <TextField
                label="Offset from (mm)"
                inputMode="decimal"
                containerClassName="w-36"
                error={e?.offsetMin?.message}
                {...register(`${base}.offsetMin` as never, numberField)}
              />
              <TextField
                label="Offset to (mm)"
                inputMode="decimal"
                containerClassName="w-36"
                error={e?.offsetMax?.message}
                {...register(`${base}.offsetMax` as never, numberField)}
              />
            </div>
            {lacking.length ? (
              <p className="text-sm text-ink-soft">
                Note: {lacking.join(', ')} {lacking.length === 1 ? 'has' : 'have'} no {fold}-fold axis, so designs in {lacking.length === 1 ? 'that group' : 'those groups'} cannot match this rule.
              </p>
            ) : null}
            {e?.message ? <p className="text-sm text-signal-error">{e.message}</p> : null}
          </div>
        );
      })}
      {listErrors?.message ? <p className="text-sm text-signal-error">{listErrors.message}</p> : null}
      <Button variant="secondary" size="sm" onClick={() => list.append(emptyFamilyRule() as never)}>
        {key === 'requiredFamilies' ? 'Add a required family' : 'Add an allowed family'}
      </Button>
    </fieldset>
  );
}

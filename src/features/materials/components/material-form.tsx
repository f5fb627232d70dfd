import { useFieldArray, useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createMaterialBodySchema, type CreateMaterialBody, type Material } from '../../../../shared/api/materials.js';
import { Button } from '../../../components/ui/button.js';
import { TextAreaField, TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { formErrorMap, nullableNumberField, numberField } from '../../../lib/form-numbers.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { useCreateMaterial } from '../api/create-material.js';
import { useDeleteMaterial } from '../api/delete-material.js';
import { useUpdateMaterial } from '../api/update-material.js';

type Values = CreateMaterialBody;

function defaultsFor(material: Material | null): Values {
  if (!material) {
    return { name: '', thickness: 3, kerf: 0.15, cuttingSpeed: null, density: null, sheetSizes: [[600, 400]], prohibited: false, prohibitedReason: null, notes: '' };
  }
  return {
    name: material.name,
    thickness: material.thickness,
    kerf: material.kerf,
    cuttingSpeed: material.cuttingSpeed,
    density: material.density,
    sheetSizes: material.sheetSizes.map(([w, h]) => [w, h] as [number, number]),
    prohibited: material.prohibited,
    prohibitedReason: material.prohibitedReason,
    notes: material.notes,
  };
}

/** Adds a material, or edits `material` when given. Prohibited materials need their reason. */
export function MaterialForm({ material, onClose }: { material: Material | null; onClose?: () => void }) {
  const form = useForm<Values>({
    resolver: zodResolver(createMaterialBodySchema, { error: formErrorMap }),
    defaultValues: defaultsFor(material),
  });
  const { register, handleSubmit, formState, control, watch, reset } = form;
  const sheets = useFieldArray({ control, name: 'sheetSizes' as never });
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const create = useCreateMaterial();
  const update = useUpdateMaterial();
  const remove = useDeleteMaterial();
  const prohibited = watch('prohibited');
  const errors = formState.errors;
  const pending = create.isPending || update.isPending || remove.isPending;

  const removeMaterial = async () => {
    if (!material) return;
    clear();
    try {
      await remove.mutateAsync(material.id);
      onClose?.();
    } catch (error) {
      // 409 while a brief uses it: the server's sentence says which.
      fail(error);
    }
  };

  const onSubmit = handleSubmit(async (values) => {
    clear();
    const body = { ...values, prohibitedReason: values.prohibited ? values.prohibitedReason : null };
    try {
      if (material) {
        const saved = await update.mutateAsync({ id: material.id, body: body as never });
        succeed(`Saved ${saved.name}.`);
        reset(defaultsFor(saved));
      } else {
        const saved = await create.mutateAsync(body);
        succeed(`Added ${saved.name} (${saved.thickness} mm, kerf ${saved.kerf} mm) to the catalogue.`);
        reset(defaultsFor(null));
      }
    } catch (error) {
      fail(error);
    }
  });

  const sheetErrors = errors.sheetSizes as unknown as (Array<{ message?: string } | undefined> & { message?: string; root?: { message?: string } }) | undefined;

  return (
    <form onSubmit={onSubmit} noValidate aria-label={material ? `Edit ${material.name}` : 'Add a material'} className="space-y-4">
      <TextField label="Name" error={errors.name?.message} {...register('name')} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Thickness (mm)" inputMode="decimal" error={errors.thickness?.message} {...register('thickness', numberField)} />
        <TextField label="Kerf (mm)" inputMode="decimal" error={errors.kerf?.message} {...register('kerf', numberField)} />
        <TextField
          label="Cutting speed (mm/s)"
          inputMode="decimal"
          hint="Leave empty when not known."
          error={errors.cuttingSpeed?.message}
          {...register('cuttingSpeed', nullableNumberField)}
        />
        <TextField
          label="Density (kg/m³)"
          inputMode="decimal"
          hint="Leave empty when not known."
          error={errors.density?.message}
          {...register('density', nullableNumberField)}
        />
      </div>
      <fieldset className="space-y-2">
        <legend className="text-sm font-medium">Sheet sizes kept in stock (mm)</legend>
        {sheets.fields.length === 0 ? <p className="text-sm text-ink-soft">No sheet sizes listed.</p> : null}
        {sheets.fields.map((field, i) => (
          <div key={field.id} className="flex flex-wrap items-start gap-2">
            <TextField
              label={`Sheet ${i + 1} width`}
              inputMode="decimal"
              containerClassName="w-32"
              error={(sheetErrors?.[i] as unknown as Array<{ message?: string }> | undefined)?.[0]?.message}
              {...register(`sheetSizes.${i}.0` as const, numberField)}
            />
            <TextField
              label={`Sheet ${i + 1} height`}
              inputMode="decimal"
              containerClassName="w-32"
              error={(sheetErrors?.[i] as unknown as Array<{ message?: string }> | undefined)?.[1]?.message}
              {...register(`sheetSizes.${i}.1` as const, numberField)}
            />
            <Button variant="quiet" size="sm" className="mt-7" onClick={() => sheets.remove(i)} aria-label={`Remove sheet size ${i + 1}`}>
              Remove
            </Button>
          </div>
        ))}
        {sheetErrors?.message || sheetErrors?.root?.message ? (
          <p className="text-sm text-signal-error">{sheetErrors.message ?? sheetErrors.root?.message}</p>
        ) : null}
        <Button variant="secondary" size="sm" onClick={() => sheets.append([600, 400] as never)}>
          Add a sheet size
        </Button>
      </fieldset>
      <div className="space-y-2 rounded-md border border-rule bg-paper/60 p-3">
        <label className="flex items-center gap-2 text-sm font-medium">
          <input type="checkbox" className="size-4 accent-accent" {...register('prohibited')} />
          Prohibited on the laser
        </label>
        {prohibited ? (
          <TextAreaField
            label="Why it is prohibited"
            hint="Shown wherever the material is listed, e.g. “PVC releases hydrogen chloride when cut.”"
            error={errors.prohibitedReason?.message}
            {...register('prohibitedReason')}
          />
        ) : null}
      </div>
      <TextAreaField label="Notes" error={errors.notes?.message} {...register('notes')} />
      <FormStatus status={status} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={pending} pendingLabel="Saving…">
          {material ? 'Save material' : 'Add material'}
        </Button>
        {material && onClose ? (
          <Button variant="secondary" onClick={onClose}>
            Close
          </Button>
        ) : null}
        {material ? (
          <Button variant="danger" className="ml-auto" pending={remove.isPending} pendingLabel="Removing…" disabled={pending} onClick={() => void removeMaterial()}>
            Remove {material.name}
          </Button>
        ) : null}
      </div>
    </form>
  );
}

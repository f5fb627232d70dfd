import { useRef, useState, type ReactNode } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { LATE_POLICIES, type Brief } from '../../../../shared/api/briefs.js';
import type { Material } from '../../../../shared/api/materials.js';
import { Button } from '../../../components/ui/button.js';
import { cn } from '../../../components/ui/cn.js';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { MarkdownView } from '../../../components/ui/markdown-view.js';
import { formErrorMap, numberField } from '../../../lib/form-numbers.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { changeBriefState } from '../api/change-brief-state.js';
import { useCreateBrief } from '../api/create-brief.js';
import { briefKeys } from '../api/keys.js';
import { useUpdateBrief } from '../api/update-brief.js';
import { briefFormDefaults, briefFormSchema, type BriefFormOutput, type BriefFormValues } from './brief-form-schema.js';
import { LATE_POLICY_LABELS } from './brief-words.js';
import { FamilyRulesFields } from './family-rules-fields.js';
import { GroupPicker } from './group-picker.js';
import { RubricFields } from './rubric-fields.js';

type Intent = 'save' | 'publish';

function Section({ title, description, children }: { title: string; description?: string; children: ReactNode }) {
  return (
    <section className="space-y-4 border-t border-rule pt-6 first:border-t-0 first:pt-0" aria-label={title}>
      <div>
        <h2 className="text-lg font-semibold">{title}</h2>
        {description ? <p className="text-sm text-ink-soft">{description}</p> : null}
      </div>
      {children}
    </section>
  );
}

/**
 * The instructor's brief editor: text with a preview, constraints, dates, late policy and rubric.
 * A new brief is saved as a draft or published at once; a published brief's changes to its
 * constraints are logged and re-audit the revisions already in.
 */
export function BriefForm({
  studioId,
  brief,
  materials,
  materialNote,
  onSaved,
}: {
  studioId: number;
  brief: Brief | null;
  materials: Material[];
  /** Shown beside the material choice (the safety cautions). */
  materialNote?: ReactNode;
  onSaved: (brief: Brief, intent: Intent | 'close') => void;
}) {
  const firstAllowed = materials.find((m) => !m.prohibited)?.id;
  const form = useForm<BriefFormValues, unknown, BriefFormOutput>({
    resolver: zodResolver(briefFormSchema, { error: formErrorMap }),
    defaultValues: briefFormDefaults(brief, firstAllowed),
  });
  const { register, handleSubmit, formState, control, setValue } = form;
  const errors = formState.errors;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const queryClient = useQueryClient();
  const create = useCreateBrief(studioId);
  const update = useUpdateBrief(brief?.id ?? 0);
  const [tab, setTab] = useState<'write' | 'preview'>('write');
  const [busy, setBusy] = useState<Intent | 'close' | null>(null);
  const [confirmClose, setConfirmClose] = useState(false);
  const intent = useRef<Intent>('save');

  const body = useWatch({ control, name: 'body' }) ?? '';
  const groups = (useWatch({ control, name: 'constraints.allowedGroups' }) as string[] | undefined) ?? [];
  const materialId = useWatch({ control, name: 'constraints.materialId' });
  const material = materials.find((m) => m.id === Number(materialId)) ?? null;
  const c = errors.constraints;
  const pieceErrors = c?.pieceCount as { message?: string; min?: { message?: string }; max?: { message?: string } } | undefined;

  const onSubmit = handleSubmit(async (values) => {
    clear();
    const action = intent.current;
    setBusy(action);
    try {
      let saved = brief ? await update.mutateAsync(values) : await create.mutateAsync(values);
      if (action === 'publish' && saved.state === 'draft') {
        saved = await changeBriefState(saved.id, 'publish');
        queryClient.setQueryData(briefKeys.detail(saved.id), saved);
        await queryClient.invalidateQueries({ queryKey: briefKeys.lists() });
      }
      succeed(action === 'publish' ? `Published “${saved.title}”.` : brief ? `Saved “${saved.title}”.` : `Saved “${saved.title}” as a draft.`);
      form.reset(briefFormDefaults(saved, firstAllowed));
      onSaved(saved, action);
    } catch (error) {
      fail(error);
    } finally {
      setBusy(null);
    }
  });

  const close = async () => {
    if (!brief) return;
    clear();
    setBusy('close');
    try {
      const saved = await changeBriefState(brief.id, 'close');
      queryClient.setQueryData(briefKeys.detail(saved.id), saved);
      await queryClient.invalidateQueries({ queryKey: briefKeys.lists() });
      succeed(`Closed “${saved.title}”: no more revisions are taken.`);
      onSaved(saved, 'close');
    } catch (error) {
      fail(error);
    } finally {
      setBusy(null);
    }
  };

  const pending = busy !== null;
  const state = brief?.state ?? 'draft';

  return (
    <form onSubmit={onSubmit} noValidate aria-label={brief ? `Edit brief ${brief.title}` : 'New brief'} className="space-y-8">
      <Section title="Text">
        <TextField label="Title" error={errors.title?.message} {...register('title')} />
        <div className="space-y-2">
          <div className="flex items-center justify-between gap-3">
            <span className="text-sm font-medium" aria-hidden="true">
              Brief text (markdown)
            </span>
            <div role="group" aria-label="Show the brief text as" className="inline-flex rounded-md border border-rule-strong">
              {(['write', 'preview'] as const).map((t) => (
                <button
                  key={t}
                  type="button"
                  aria-pressed={tab === t}
                  onClick={() => setTab(t)}
                  className={cn('px-3 py-1 text-sm first:rounded-l-md last:rounded-r-md', tab === t ? 'bg-accent-wash font-medium text-accent-strong' : 'text-ink-soft')}
                >
                  {t === 'write' ? 'Write' : 'Preview'}
                </button>
              ))}
            </div>
          </div>
          <div className={tab === 'write' ? '' : 'hidden'}>
            <TextAreaField
              label={<span className="sr-only">Brief text (markdown)</span>}
              className="min-h-56 font-mono text-sm"
              hint="Headings with #, lists with -, links as [text](https://…). HTML is not shown."
              error={errors.body?.message}
              {...register('body')}
            />
          </div>
          {tab === 'preview' ? (
            <div className="min-h-56 rounded-md border border-rule bg-paper-raised p-4" aria-label="Preview of the brief text">
              {body.trim() ? <MarkdownView source={body} /> : <p className="text-sm text-ink-soft">Nothing written yet.</p>}
            </div>
          ) : null}
        </div>
      </Section>

      <Section title="Constraints" description="Every revision is audited against these; they win over what a design document says.">
        <Controller
          control={control}
          name="constraints.allowedGroups"
          render={({ field, fieldState }) => <GroupPicker value={field.value as string[]} onChange={field.onChange} error={fieldState.error?.message} />}
        />
        <FamilyRulesFields
          name="constraints.requiredFamilies"
          title="Required families"
          description="Every design must use a family matching each rule."
          control={control}
          register={register}
          errors={errors}
          groups={groups}
        />
        <FamilyRulesFields
          name="constraints.allowedFamilies"
          title="Other allowed families"
          description="With no rules here, only the required families are allowed; with no rules at all, any family is."
          control={control}
          register={register}
          errors={errors}
          groups={groups}
        />
        <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
          <div className="space-y-3">
            <SelectField label="Material" error={c?.materialId?.message} {...register('constraints.materialId', numberField)}>
              {materials.length === 0 ? <option value="">The catalogue is empty</option> : null}
              {materials.map((m) => (
                <option key={m.id} value={m.id} disabled={m.prohibited}>
                  {m.name} — {m.thickness} mm, kerf {m.kerf} mm{m.prohibited ? ` (prohibited: ${m.prohibitedReason ?? 'not allowed on the laser'})` : ''}
                </option>
              ))}
            </SelectField>
            {material ? (
              <p className="font-mono text-xs text-ink-soft" aria-live="polite">
                {material.name}: thickness {material.thickness} mm · kerf {material.kerf} mm
                {material.cuttingSpeed ? ` · ${material.cuttingSpeed} mm/s` : ''}
              </p>
            ) : null}
            {materials.some((m) => m.prohibited) ? (
              <ul className="space-y-1 text-xs text-ink-soft" aria-label="Prohibited materials">
                {materials
                  .filter((m) => m.prohibited)
                  .map((m) => (
                    <li key={m.id}>
                      <span className="font-medium text-signal-error">{m.name}</span> cannot be chosen: {m.prohibitedReason ?? 'prohibited on the laser'}
                    </li>
                  ))}
              </ul>
            ) : null}
            <div className="flex flex-wrap items-start gap-3">
              <TextField label="Sheet width (mm)" inputMode="decimal" containerClassName="w-36" error={c?.sheet?.[0]?.message ?? c?.sheet?.message} {...register('constraints.sheet.0', numberField)} />
              <TextField label="Sheet height (mm)" inputMode="decimal" containerClassName="w-36" error={c?.sheet?.[1]?.message} {...register('constraints.sheet.1', numberField)} />
              <TextField label="Maximum sheets" inputMode="numeric" containerClassName="w-36" error={c?.maxSheets?.message} {...register('constraints.maxSheets', numberField)} />
            </div>
            {material && material.sheetSizes.length > 0 ? (
              <div className="flex flex-wrap items-center gap-2 text-sm">
                <span className="text-ink-soft">Stock sizes:</span>
                {material.sheetSizes.map(([w, h]) => (
                  <Button
                    key={`${w}x${h}`}
                    variant="secondary"
                    size="sm"
                    onClick={() => {
                      setValue('constraints.sheet.0', w, { shouldDirty: true });
                      setValue('constraints.sheet.1', h, { shouldDirty: true });
                    }}
                    aria-label={`Use the stock sheet ${w} by ${h} mm`}
                  >
                    {w} × {h}
                  </Button>
                ))}
              </div>
            ) : null}
          </div>
          {materialNote ? <div>{materialNote}</div> : null}
        </div>
        <div className="flex flex-wrap items-start gap-3">
          <TextField
            label="Angle tolerance (°)"
            inputMode="decimal"
            containerClassName="w-40"
            error={c?.angleToleranceDeg?.message}
            {...register('constraints.angleToleranceDeg', numberField)}
          />
          <TextField
            label="Minimum joint length (mm)"
            inputMode="decimal"
            containerClassName="w-52"
            hint="Empty: twice the thickness."
            error={c?.minJointLength?.message}
            {...register('constraints.minJointLength', numberField)}
          />
          <TextField
            label="Pieces at least"
            inputMode="numeric"
            containerClassName="w-36"
            hint="Empty: no limit."
            error={pieceErrors?.min?.message ?? pieceErrors?.message}
            {...register('constraints.pieceCount.min' as never, numberField)}
          />
          <TextField
            label="Pieces at most"
            inputMode="numeric"
            containerClassName="w-36"
            error={pieceErrors?.max?.message}
            {...register('constraints.pieceCount.max' as never, numberField)}
          />
        </div>
      </Section>

      <Section title="Dates">
        <div className="flex flex-wrap items-start gap-4">
          <TextField label="Deadline" type="datetime-local" containerClassName="w-60" error={errors.deadline?.message} {...register('deadline')} />
          <SelectField label="Late revisions" containerClassName="w-60" error={errors.latePolicy?.message} {...register('latePolicy')}>
            {LATE_POLICIES.map((p) => (
              <option key={p} value={p}>
                {LATE_POLICY_LABELS[p]}
              </option>
            ))}
          </SelectField>
        </div>
        <div className="flex flex-wrap items-start gap-4">
          <TextField
            label="Critique opens"
            type="datetime-local"
            containerClassName="w-60"
            hint="Leave both empty until the pin-up is planned."
            error={(errors.critiqueWindow as { opensAt?: { message?: string } } | undefined)?.opensAt?.message ?? errors.critiqueWindow?.message}
            {...register('critiqueWindow.opensAt' as never)}
          />
          <TextField
            label="Critique closes"
            type="datetime-local"
            containerClassName="w-60"
            error={(errors.critiqueWindow as { closesAt?: { message?: string } } | undefined)?.closesAt?.message}
            {...register('critiqueWindow.closesAt' as never)}
          />
        </div>
      </Section>

      <Section title="Rubric" description="Weights are relative; they need not add up to anything.">
        <RubricFields control={control} register={register} errors={errors} />
      </Section>

      <div className="space-y-3 border-t border-rule pt-6">
        {state === 'published' ? (
          <p className="text-sm text-ink-soft">This brief is published: a change to its constraints is written to the changelog and every latest revision is audited again.</p>
        ) : null}
        <FormStatus status={status} />
        <div className="flex flex-wrap gap-2">
          {state === 'draft' ? (
            <>
              <Button type="submit" variant="secondary" pending={busy === 'save'} pendingLabel="Saving…" disabled={pending} onClick={() => (intent.current = 'save')}>
                Save draft
              </Button>
              <Button type="submit" pending={busy === 'publish'} pendingLabel="Publishing…" disabled={pending} onClick={() => (intent.current = 'publish')}>
                Publish brief
              </Button>
            </>
          ) : (
            <Button type="submit" pending={busy === 'save'} pendingLabel="Saving…" disabled={pending || state === 'closed'} onClick={() => (intent.current = 'save')}>
              Save changes
            </Button>
          )}
          {state === 'published' && !confirmClose ? (
            <Button variant="danger" disabled={pending} onClick={() => setConfirmClose(true)}>
              Close brief
            </Button>
          ) : null}
          {state === 'published' && confirmClose ? (
            <span className="flex flex-wrap items-center gap-2 rounded-md border border-signal-error/60 bg-signal-error-wash/50 px-3 py-1.5 text-sm" role="group" aria-label="Confirm closing the brief">
              Closing takes no more revisions.
              <Button variant="danger" size="sm" pending={busy === 'close'} pendingLabel="Closing…" disabled={pending} onClick={() => void close()}>
                Yes, close the brief
              </Button>
              <Button variant="secondary" size="sm" disabled={pending} onClick={() => setConfirmClose(false)}>
                Keep it open
              </Button>
            </span>
          ) : null}
        </div>
      </div>
    </form>
  );
}

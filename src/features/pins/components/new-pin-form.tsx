import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { PIN_CATEGORIES, PIN_CATEGORY_LABELS, createPinBodySchema, type CameraView, type CreatePinBody, type PinCategory, type PinScope } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { SelectField, TextAreaField } from '../../../components/ui/field.js';

/** Where the new pin goes, as the viewer reported it. */
export interface PinDraft {
  readonly anchor: { readonly piece: string; readonly point: readonly [number, number]; readonly side: 1 | -1 };
  readonly camera: CameraView;
  /** Pieces of the piece's motif (1: no orbit to speak of). */
  readonly orbitSize: number;
}

export interface NewPinValues {
  category: PinCategory;
  scope: PinScope;
  body: string;
}

export const EMPTY_PIN_VALUES: NewPinValues = { category: 'structure', scope: 'piece', body: '' };

/** The create body of a draft and the form's values (the schema's shape, not yet checked). */
export function pinBody(draft: PinDraft, values: NewPinValues): CreatePinBody {
  return {
    anchor: { piece: draft.anchor.piece, point: [draft.anchor.point[0], draft.anchor.point[1]], side: draft.anchor.side },
    scope: values.scope,
    category: values.category,
    camera: { position: [...draft.camera.position], target: [...draft.camera.target] },
    body: values.body,
  };
}

/**
 * The form next to the model once a piece is picked: the piece named, a category, the scope
 * (this piece or every piece of its orbit) and the first comment in markdown. The camera the
 * author looked through is saved with it. Escape or Cancel drops the pin.
 */
export function NewPinForm({
  draft,
  initial = EMPTY_PIN_VALUES,
  problem,
  onSave,
  onCancel,
}: {
  draft: PinDraft;
  initial?: NewPinValues;
  /** The server's refusal of an earlier try, shown at the top. */
  problem?: string | null;
  onSave(body: CreatePinBody, values: NewPinValues): void;
  onCancel(): void;
}) {
  const [values, setValues] = useState<NewPinValues>(initial);
  const [error, setError] = useState<string | null>(null);
  const headingId = useId();
  const scopeName = useId();
  const bodyRef = useRef<HTMLTextAreaElement>(null);
  useEffect(() => bodyRef.current?.focus({ preventScroll: true }), [draft]);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const body = pinBody(draft, values);
    const parsed = createPinBodySchema.safeParse(body);
    if (!parsed.success) {
      const issue = parsed.error.issues.find((i) => i.path[0] === 'body') ?? parsed.error.issues[0];
      setError(issue ? issue.message : 'Write a comment');
      return;
    }
    setError(null);
    onSave({ ...body, body: parsed.data.body }, values);
  };
  return (
    <form
      onSubmit={submit}
      onKeyDown={(e) => {
        if (e.key === 'Escape') {
          e.preventDefault();
          e.stopPropagation();
          onCancel();
        }
      }}
      aria-labelledby={headingId}
      noValidate
      className="space-y-3 rounded-md border border-accent bg-paper-raised px-3 py-3 text-sm"
      data-testid="new-pin-form"
    >
      <h3 id={headingId} className="font-semibold">
        New pin on <span className="font-mono">{draft.anchor.piece}</span>
      </h3>
      <p className="text-ink-soft">
        On the {draft.anchor.side === 1 ? 'front' : 'back'} face, at ({draft.anchor.point[0].toFixed(1)}, {draft.anchor.point[1].toFixed(1)}) mm in the piece's frame. The current view is
        saved with the pin.
      </p>
      {problem ? (
        <p role="alert" className="rounded-md border border-signal-error/60 bg-signal-error-wash px-2 py-1.5 text-ink">
          The pin was not saved: {problem}
        </p>
      ) : null}
      <SelectField label="Category" value={values.category} onChange={(e) => setValues({ ...values, category: e.target.value as PinCategory })}>
        {PIN_CATEGORIES.map((c) => (
          <option key={c} value={c}>
            {PIN_CATEGORY_LABELS[c]}
          </option>
        ))}
      </SelectField>
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium">Applies to</legend>
        <label className="flex items-center gap-2">
          <input type="radio" name={scopeName} checked={values.scope === 'piece'} onChange={() => setValues({ ...values, scope: 'piece' })} />
          This piece
        </label>
        <label className="flex items-center gap-2">
          <input type="radio" name={scopeName} checked={values.scope === 'orbit'} disabled={draft.orbitSize < 2} onChange={() => setValues({ ...values, scope: 'orbit' })} />
          Every piece of its orbit ({draft.orbitSize} {draft.orbitSize === 1 ? 'piece' : 'pieces'})
        </label>
      </fieldset>
      <TextAreaField
        ref={bodyRef}
        label="Comment"
        hint="Markdown: **bold**, lists, links. HTML tags are left out."
        error={error ?? undefined}
        value={values.body}
        onChange={(e) => setValues({ ...values, body: e.target.value })}
        rows={4}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" size="sm">
          Save pin
        </Button>
        <Button variant="secondary" size="sm" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

import { useId, useRef, useState } from 'react';
import { revisionFormFieldsSchema, UPLOAD_LIMITS, type RevisionDetail } from '../../../../shared/api/revisions.js';
import { Button } from '../../../components/ui/button.js';
import { cn } from '../../../components/ui/cn.js';
import { describeError } from '../../../components/ui/error-state.js';
import { SelectField, TextField } from '../../../components/ui/field.js';
import { FileField, formatBytes } from '../../../components/ui/file-field.js';
import { FormStatus, type FormStatusValue } from '../../../components/ui/form-status.js';
import { ProgressBar } from '../../../components/ui/progress-bar.js';
import { isApiError, type UploadProgress } from '../../../lib/api-client.js';
import { fieldNameFromPath } from '../../../lib/form-errors.js';
import { useCreateRevision } from '../api/create-revision.js';

type Mode = 'file' | 'form';
type Errors = Record<string, string>;

interface FamilyRow {
  id: string;
  by: 'axis' | 'normal';
  axis: string;
  normal: [string, string, string];
  offset: string;
}
interface MotifRow {
  id: string;
  family: string;
  files: File[];
}

/** The folds a group's axes have, for the family's fold choice (FORMAT.md canonical normals). */
export function foldsOf(group: string): number[] {
  if (group === 'I') return [2, 3, 5];
  if (group === 'O') return [2, 3, 4];
  if (group === 'T') return [2, 3];
  const m = /^([CD])(\d+)$/.exec(group);
  if (!m) return [];
  const n = Number(m[2]);
  return m[1] === 'C' ? [n] : [...new Set([n, 2])].sort((a, b) => a - b);
}

const OUTLINE_ACCEPT = '.svg,.dxf,image/svg+xml,application/dxf';
const PHOTO_ACCEPT = '.jpg,.jpeg,.png,image/jpeg,image/png';

function num(text: string): number | undefined {
  const t = text.trim().replace(',', '.');
  if (t === '') return undefined;
  const n = Number(t);
  return Number.isFinite(n) ? n : Number.NaN;
}

function sizeProblem(files: File[], limit: number, what: string): string | null {
  const big = files.find((f) => f.size > limit);
  return big ? `${big.name} is ${formatBytes(big.size)}; ${what} may be at most ${formatBytes(limit)}.` : null;
}

/** Whether the panel shows a message for `key` at a field in this mode (else it goes in the status line). */
export function isShown(key: string, mode: Mode, motifCount: number): boolean {
  if (key === 'files.photos') return true;
  if (mode === 'file') return key === 'files.design';
  if (['title', 'group', 'families', 'motifs'].includes(key)) return true;
  if (/^families\.\d+\.(id|axis|offset|normal(\.[0-2])?)$/.test(key)) return true;
  const motif = /^motifs\.(\d+)\.(id|family|file)$/.exec(key) ?? /^files\.outline-(\d+)$/.exec(key);
  if (!motif) return false;
  const index = key.startsWith('files.') ? Number(motif[1]) - 1 : Number(motif[1]);
  return index >= 0 && index < motifCount;
}

function outlineField(index: number): string {
  return `outline-${index + 1}`;
}

function Tab({ active, onClick, children, controls }: { active: boolean; onClick: () => void; children: string; controls: string }) {
  return (
    <button
      type="button"
      role="tab"
      aria-selected={active}
      aria-controls={controls}
      onClick={onClick}
      className={cn(
        '-mb-px border-b-2 px-3 py-2 text-sm font-medium',
        active ? 'border-accent text-accent-strong' : 'border-transparent text-ink-soft hover:text-ink',
      )}
    >
      {children}
    </button>
  );
}

/**
 * Uploads a revision: a design document file, or a design built here from a group, families and
 * one outline file (SVG, DXF or a filled-in drawing template) per motif; photos optional. Shows
 * the upload's progress and puts the server's messages at the fields they name. A failed upload
 * keeps everything chosen, so the next try is one click.
 */
export function UploadRevisionPanel({
  briefId,
  groups,
  onUploaded,
}: {
  briefId: number;
  groups: string[];
  onUploaded: (revision: RevisionDetail) => void;
}) {
  const [mode, setMode] = useState<Mode>('file');
  const [design, setDesign] = useState<File[]>([]);
  const [photos, setPhotos] = useState<File[]>([]);
  const [title, setTitle] = useState('');
  const [group, setGroup] = useState(groups[0] ?? '');
  const [families, setFamilies] = useState<FamilyRow[]>([{ id: 'ribs', by: 'axis', axis: String(foldsOf(groups[0] ?? '')[0] ?? 2), normal: ['', '', '1'], offset: '100' }]);
  const [motifs, setMotifs] = useState<MotifRow[]>([{ id: 'rib', family: 'ribs', files: [] }]);
  const [errors, setErrors] = useState<Errors>({});
  const [status, setStatus] = useState<FormStatusValue>(null);
  const [progress, setProgress] = useState<UploadProgress | null>(null);
  const [formKey, setFormKey] = useState(0);
  const abort = useRef<AbortController | null>(null);
  const create = useCreateRevision(briefId);
  const tabsId = useId();
  const folds = foldsOf(group);

  const setFamily = (i: number, patch: Partial<FamilyRow>) => setFamilies((rows) => rows.map((r, k) => (k === i ? { ...r, ...patch } : r)));
  const setMotif = (i: number, patch: Partial<MotifRow>) => setMotifs((rows) => rows.map((r, k) => (k === i ? { ...r, ...patch } : r)));

  async function buildForm(): Promise<{ form: FormData | null; errors: Errors }> {
    const errs: Errors = {};
    const form = new FormData();
    const photoProblem = photos.length > UPLOAD_LIMITS.files ? `Choose at most ${UPLOAD_LIMITS.files} photos.` : sizeProblem(photos, UPLOAD_LIMITS.photo, 'a photo');
    if (photoProblem) errs['files.photos'] = photoProblem;

    if (mode === 'file') {
      const file = design[0];
      if (!file) errs['files.design'] = 'Choose the design document (a .json file).';
      else if (file.size > UPLOAD_LIMITS.design) errs['files.design'] = sizeProblem([file], UPLOAD_LIMITS.design, 'a design document')!;
      else {
        try {
          JSON.parse(await file.text());
        } catch (e) {
          errs['files.design'] = `${file.name} is not valid JSON (${e instanceof Error ? e.message : 'unreadable'}). Save it again as a design document and retry.`;
        }
        form.append('design', file, file.name);
      }
    } else {
      const fields = {
        ...(title.trim() ? { title: title.trim() } : {}),
        group,
        families: families.map((f) => ({
          id: f.id.trim(),
          ...(f.by === 'axis' ? { axis: num(f.axis) } : { normal: f.normal.map(num) }),
          offset: num(f.offset),
        })),
        motifs: motifs.map((m, i) => ({ id: m.id.trim(), family: m.family, file: outlineField(i) })),
      };
      const parsed = revisionFormFieldsSchema.safeParse(fields, {
        error: (issue) => (issue.code === 'invalid_type' ? (issue.expected === 'number' ? 'Enter a number' : 'Fill this in') : undefined),
      });
      if (!parsed.success) {
        for (const issue of parsed.error.issues) {
          const key = issue.path.join('.');
          errs[key] ??= issue.message;
        }
      }
      const familyIds = new Set(families.map((f) => f.id.trim()));
      if (familyIds.size !== families.length) errs['families'] = 'Give every family its own id.';
      if (motifs.length === 0) errs['motifs'] = 'Add at least one motif.';
      motifs.forEach((m, i) => {
        if (!familyIds.has(m.family)) errs[`motifs.${i}.family`] = 'Choose one of the families above.';
        const file = m.files[0];
        if (!file) errs[`files.${outlineField(i)}`] = 'Choose the outline: an SVG, a DXF or a filled-in drawing template.';
        else {
          const big = sizeProblem([file], UPLOAD_LIMITS.outline, 'an outline');
          if (big) errs[`files.${outlineField(i)}`] = big;
        }
      });
      if (parsed.success) {
        const d = parsed.data;
        if (d.title) form.append('title', d.title);
        form.append('group', d.group);
        form.append('families', JSON.stringify(d.families));
        form.append('motifs', JSON.stringify(d.motifs));
      }
      motifs.forEach((m, i) => {
        if (m.files[0]) form.append(outlineField(i), m.files[0], m.files[0].name);
      });
    }
    for (const p of photos) form.append('photos', p, p.name);
    return { form: Object.keys(errs).length ? null : form, errors: errs };
  }

  const placeServerErrors = (fields: Record<string, string>): string[] => {
    const placed: Errors = {};
    const rest: string[] = [];
    for (const [path, message] of Object.entries(fields)) {
      const key = fieldNameFromPath(path);
      const motif = mode === 'form' ? /^design\.motifs\.(\d+)/.exec(key) : null;
      const family = mode === 'form' ? /^design\.families\.(\d+)(\.\w+)?/.exec(key) : null;
      if (motif) {
        // The built document's motif N is the form's motif N, whose outline file caused it.
        const field = `files.${outlineField(Number(motif[1]))}`;
        placed[field] = [placed[field], message].filter(Boolean).join(' ');
      } else if (family) {
        placed[`families.${family[1]}${family[2] ?? '.id'}`] = message;
      } else if (key.startsWith('design') || key === 'files.design') {
        // Problems inside the design document belong to its file field, naming where in the file;
        // the server may say one problem twice (at the file and at the path inside it).
        const where = key.replace(/^design\.?/, '').replace(/^files\.design$/, '');
        const text = where && !message.startsWith(`${where}:`) ? `${where}: ${message}` : message;
        const before = placed['files.design'];
        if (!before) placed['files.design'] = text;
        else if (!before.includes(message)) placed['files.design'] = `${before} ${text}`;
      } else placed[key] = message;
    }
    setErrors(placed);
    for (const [key, message] of Object.entries(placed)) {
      if (!isShown(key, mode, motifs.length)) rest.push(`${key}: ${message}`);
    }
    return rest;
  };

  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    if (create.isPending) return;
    setStatus(null);
    const built = await buildForm();
    setErrors(built.errors);
    if (!built.form) {
      setStatus({ kind: 'error', message: 'Nothing was sent: fix the fields marked below.' });
      return;
    }
    const controller = new AbortController();
    abort.current = controller;
    setProgress({ loaded: 0, total: null, fraction: 0 });
    try {
      const revision = await create.mutateAsync({ form: built.form, onProgress: setProgress, signal: controller.signal });
      setStatus({ kind: 'success', message: `Revision ${revision.number} received; its audit is ${revision.audit.state}.` });
      setDesign([]);
      setPhotos([]);
      setMotifs((rows) => rows.map((r) => ({ ...r, files: [] })));
      setFormKey((k) => k + 1);
      onUploaded(revision);
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') {
        setStatus({ kind: 'error', message: 'Upload cancelled; nothing was stored.' });
      } else if (isApiError(error)) {
        const rest = placeServerErrors(error.fields);
        setStatus({ kind: 'error', message: [error.message, ...rest].join(' ') });
      } else {
        setStatus({ kind: 'error', message: describeError(error) });
      }
    } finally {
      setProgress(null);
      abort.current = null;
    }
  };

  const pending = create.isPending;

  return (
    <form onSubmit={submit} noValidate aria-label="Upload a revision" className="space-y-5">
      <div role="tablist" aria-label="How to upload" className="flex gap-1 border-b border-rule">
        <Tab active={mode === 'file'} onClick={() => setMode('file')} controls={`${tabsId}-panel`}>
          Design document file
        </Tab>
        <Tab active={mode === 'form'} onClick={() => setMode('form')} controls={`${tabsId}-panel`}>
          Build from outlines
        </Tab>
      </div>

      <div id={`${tabsId}-panel`} role="tabpanel" aria-label={mode === 'file' ? 'Design document file' : 'Build from outlines'} className="space-y-4" key={`${mode}-${formKey}`}>
        {mode === 'file' ? (
          <FileField
            label="Design document (.json)"
            hint={`The planewright/design@1 document, at most ${formatBytes(UPLOAD_LIMITS.design)}. The brief's material and limits replace the document's own.`}
            accept=".json,application/json"
            files={design}
            onChange={setDesign}
            error={errors['files.design']}
            disabled={pending}
          />
        ) : (
          <>
            <div className="grid gap-4 sm:grid-cols-2">
              <TextField label="Title (optional)" value={title} onChange={(e) => setTitle(e.target.value)} error={errors.title} disabled={pending} />
              <SelectField
                label="Symmetry group"
                value={group}
                onChange={(e) => setGroup(e.target.value)}
                error={errors.group}
                disabled={pending}
                hint="The groups this brief allows."
              >
                {groups.map((g) => (
                  <option key={g} value={g}>
                    {g}
                  </option>
                ))}
              </SelectField>
            </div>

            <fieldset className="space-y-3">
              <legend className="text-sm font-medium">Families of planes</legend>
              {families.map((f, i) => (
                <div key={i} role="group" aria-label={`Family ${i + 1}`} className="flex flex-wrap items-start gap-3 rounded-md border border-rule bg-paper/50 p-3">
                  <TextField label={`Family ${i + 1} id`} containerClassName="w-32" value={f.id} onChange={(e) => setFamily(i, { id: e.target.value })} error={errors[`families.${i}.id`]} disabled={pending} />
                  <SelectField
                    label={`Family ${i + 1} plane`}
                    containerClassName="w-52"
                    value={f.by === 'axis' ? `axis:${f.axis}` : 'normal'}
                    onChange={(e) => {
                      const v = e.target.value;
                      setFamily(i, v === 'normal' ? { by: 'normal' } : { by: 'axis', axis: v.slice(5) });
                    }}
                    error={errors[`families.${i}.axis`]}
                    disabled={pending}
                  >
                    {folds.map((n) => (
                      <option key={n} value={`axis:${n}`}>
                        Square to a {n}-fold axis
                      </option>
                    ))}
                    {f.by === 'axis' && !folds.includes(Number(f.axis)) ? <option value={`axis:${f.axis}`}>{f.axis}-fold axis (not in {group})</option> : null}
                    <option value="normal">Any normal…</option>
                  </SelectField>
                  {f.by === 'normal'
                    ? (['x', 'y', 'z'] as const).map((c, k) => (
                        <TextField
                          key={c}
                          label={`Family ${i + 1} normal ${c}`}
                          inputMode="decimal"
                          containerClassName="w-28"
                          value={f.normal[k]}
                          onChange={(e) => setFamily(i, { normal: f.normal.map((x, j) => (j === k ? e.target.value : x)) as FamilyRow['normal'] })}
                          error={errors[`families.${i}.normal.${k}`] ?? (k === 0 ? errors[`families.${i}.normal`] : undefined)}
                          disabled={pending}
                        />
                      ))
                    : null}
                  <TextField
                    label={`Family ${i + 1} offset (mm)`}
                    inputMode="decimal"
                    containerClassName="w-40"
                    value={f.offset}
                    onChange={(e) => setFamily(i, { offset: e.target.value })}
                    error={errors[`families.${i}.offset`]}
                    disabled={pending}
                  />
                  {families.length > 1 ? (
                    <Button variant="quiet" size="sm" className="mt-7" onClick={() => setFamilies((rows) => rows.filter((_, k) => k !== i))} aria-label={`Remove family ${i + 1}`} disabled={pending}>
                      Remove
                    </Button>
                  ) : null}
                </div>
              ))}
              {errors.families ? <p className="text-sm text-signal-error">{errors.families}</p> : null}
              <Button
                variant="secondary"
                size="sm"
                disabled={pending || families.length >= 20}
                onClick={() => setFamilies((rows) => [...rows, { id: `family-${rows.length + 1}`, by: 'axis', axis: String(folds[0] ?? 2), normal: ['', '', '1'], offset: '100' }])}
              >
                Add a family
              </Button>
            </fieldset>

            <fieldset className="space-y-3">
              <legend className="text-sm font-medium">Motifs (one outline each)</legend>
              {motifs.map((m, i) => (
                <div key={i} role="group" aria-label={`Motif ${i + 1}`} className="space-y-3 rounded-md border border-rule bg-paper/50 p-3">
                  <div className="flex flex-wrap items-start gap-3">
                    <TextField label={`Motif ${i + 1} id`} containerClassName="w-32" value={m.id} onChange={(e) => setMotif(i, { id: e.target.value })} error={errors[`motifs.${i}.id`]} disabled={pending} />
                    <SelectField label={`Motif ${i + 1} family`} containerClassName="w-40" value={m.family} onChange={(e) => setMotif(i, { family: e.target.value })} error={errors[`motifs.${i}.family`]} disabled={pending}>
                      {families.map((f, k) => (
                        <option key={k} value={f.id.trim()}>
                          {f.id.trim() || `family ${k + 1}`}
                        </option>
                      ))}
                    </SelectField>
                    {motifs.length > 1 ? (
                      <Button variant="quiet" size="sm" className="mt-7" onClick={() => setMotifs((rows) => rows.filter((_, k) => k !== i))} aria-label={`Remove motif ${i + 1}`} disabled={pending}>
                        Remove
                      </Button>
                    ) : null}
                  </div>
                  <FileField
                    label={`Motif ${i + 1} outline (SVG, DXF or filled-in drawing template)`}
                    hint={`Units and viewBox (SVG) or $INSUNITS (DXF) are honoured; at most ${formatBytes(UPLOAD_LIMITS.outline)}.`}
                    accept={OUTLINE_ACCEPT}
                    files={m.files}
                    onChange={(files) => setMotif(i, { files })}
                    error={errors[`files.${outlineField(i)}`] ?? errors[`motifs.${i}.file`]}
                    disabled={pending}
                  />
                </div>
              ))}
              {errors.motifs ? <p className="text-sm text-signal-error">{errors.motifs}</p> : null}
              <Button
                variant="secondary"
                size="sm"
                disabled={pending || motifs.length >= 10}
                onClick={() => setMotifs((rows) => [...rows, { id: `motif-${rows.length + 1}`, family: families[0]?.id.trim() ?? '', files: [] }])}
              >
                Add a motif
              </Button>
            </fieldset>
          </>
        )}

        <FileField
          label="Photos (optional, JPEG or PNG)"
          hint={`Up to ${UPLOAD_LIMITS.files} photos, each at most ${formatBytes(UPLOAD_LIMITS.photo)}; location and camera data are removed.`}
          accept={PHOTO_ACCEPT}
          multiple
          files={photos}
          onChange={setPhotos}
          error={errors['files.photos']}
          disabled={pending}
        />
      </div>

      {progress ? <ProgressBar label="Uploading the revision" value={progress.fraction} /> : null}
      <FormStatus status={status} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" pending={pending} pendingLabel="Uploading…">
          Upload revision
        </Button>
        {pending ? (
          <Button variant="secondary" onClick={() => abort.current?.abort()}>
            Cancel upload
          </Button>
        ) : null}
      </div>
    </form>
  );
}

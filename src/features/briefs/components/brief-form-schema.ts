import { z } from 'zod';
import {
  briefConstraintsSchema,
  createBriefBodySchema,
  critiqueWindowSchema,
  familyRuleSchema,
  type Brief,
  type CreateBriefBody,
} from '../../../../shared/api/briefs.js';
import { localDateTimeSchema } from '../../../lib/form-dates.js';
import { fromLocalInput, toLocalInput } from '../../../lib/format.js';

export interface FamilyRuleForm {
  group: string;
  mode: 'axis' | 'normal';
  axis?: number;
  normal: [number | undefined, number | undefined, number | undefined];
  offsetMin?: number;
  offsetMax?: number;
}

const familyRuleForm = z.preprocess((raw) => {
  const r = raw as FamilyRuleForm;
  return {
    ...(r.group ? { group: r.group } : {}),
    ...(r.mode === 'normal' ? { normal: r.normal } : { axis: r.axis }),
    offsetMin: r.offsetMin,
    offsetMax: r.offsetMax,
  };
}, familyRuleSchema);

/**
 * The brief editor's form: the shared create schema, with the few fields a form holds
 * differently — local date-times instead of ISO instants, a family rule's axis-or-normal choice,
 * and empty boxes for optional values. The output is a {@link CreateBriefBody}.
 */
export const briefFormSchema = createBriefBodySchema.extend({
  deadline: localDateTimeSchema,
  critiqueWindow: z
    .object({ opensAt: z.string(), closesAt: z.string() })
    .transform((w, ctx) => {
      if (!w.opensAt && !w.closesAt) return null;
      const opensAt = w.opensAt ? fromLocalInput(w.opensAt) : null;
      const closesAt = w.closesAt ? fromLocalInput(w.closesAt) : null;
      if (!opensAt) ctx.addIssue({ code: 'custom', path: ['opensAt'], message: 'Choose when the critique opens, or clear both dates' });
      if (!closesAt) ctx.addIssue({ code: 'custom', path: ['closesAt'], message: 'Choose when the critique closes, or clear both dates' });
      return opensAt && closesAt ? { opensAt, closesAt } : z.NEVER;
    })
    .pipe(critiqueWindowSchema.nullable()),
  constraints: briefConstraintsSchema.extend({
    requiredFamilies: z.array(familyRuleForm).max(20, 'At most 20 rules'),
    allowedFamilies: z.array(familyRuleForm).max(20, 'At most 20 rules'),
    pieceCount: z.preprocess(
      (raw) => {
        const p = raw as { min?: number; max?: number } | undefined;
        return !p || (p.min === undefined && p.max === undefined) ? undefined : p;
      },
      briefConstraintsSchema.shape.pieceCount,
    ),
  }),
});

export type BriefFormValues = z.input<typeof briefFormSchema>;
export type BriefFormOutput = z.output<typeof briefFormSchema>;

export function emptyFamilyRule(): FamilyRuleForm {
  return { group: '', mode: 'axis', axis: 2, normal: [undefined, undefined, 1], offsetMin: 60, offsetMax: 160 };
}

function ruleToForm(rule: Brief['constraints']['requiredFamilies'][number]): FamilyRuleForm {
  return {
    group: rule.group ?? '',
    mode: rule.normal ? 'normal' : 'axis',
    axis: rule.axis,
    normal: rule.normal ? [rule.normal[0], rule.normal[1], rule.normal[2]] : [undefined, undefined, 1],
    offsetMin: rule.offsetMin,
    offsetMax: rule.offsetMax,
  };
}

/** Form values for a new brief (a fortnight from now, common settings) or an existing one. */
export function briefFormDefaults(brief: Brief | null, firstMaterialId: number | undefined): BriefFormValues {
  if (!brief) {
    const deadline = new Date(Date.now() + 14 * 86_400_000);
    deadline.setHours(17, 0, 0, 0);
    return {
      title: '',
      body: '',
      deadline: toLocalInput(deadline.toISOString()),
      latePolicy: 'accept-marked-late',
      critiqueWindow: { opensAt: '', closesAt: '' } as never,
      rubric: [],
      constraints: {
        allowedGroups: ['I'],
        requiredFamilies: [],
        allowedFamilies: [],
        materialId: firstMaterialId as number,
        sheet: [600, 400],
        maxSheets: 4,
        angleToleranceDeg: 0.5,
        minJointLength: undefined,
        pieceCount: undefined,
      },
    };
  }
  const c = brief.constraints;
  return {
    title: brief.title,
    body: brief.body,
    deadline: toLocalInput(brief.deadline),
    latePolicy: brief.latePolicy,
    critiqueWindow: {
      opensAt: toLocalInput(brief.critiqueWindow?.opensAt),
      closesAt: toLocalInput(brief.critiqueWindow?.closesAt),
    } as never,
    rubric: brief.rubric.map((r) => ({ ...r, levels: r.levels.map((l) => ({ ...l })) })),
    constraints: {
      allowedGroups: [...c.allowedGroups],
      requiredFamilies: c.requiredFamilies.map(ruleToForm) as never,
      allowedFamilies: c.allowedFamilies.map(ruleToForm) as never,
      materialId: c.materialId,
      sheet: [c.sheet[0], c.sheet[1]],
      maxSheets: c.maxSheets,
      angleToleranceDeg: c.angleToleranceDeg,
      minJointLength: c.minJointLength,
      pieceCount: c.pieceCount ? { ...c.pieceCount } : (undefined as never),
    },
  };
}

/** The body the API takes, from the parsed form. */
export function toBriefBody(values: BriefFormOutput): CreateBriefBody {
  return values;
}

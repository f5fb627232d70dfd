/**
 * Payloads of /api/materials: the maker space's material catalogue (admin writes, every signed-in
 * person reads), and the safety cautions shown wherever a material is chosen.
 */
import { z } from 'zod';

/** A sheet size in millimetres, `[width, height]`, each side 1–10,000 mm. */
export const sheetSizeSchema = z.tuple([
  z.number().gt(0, 'must be greater than 0').max(10_000, 'may be at most 10000 mm'),
  z.number().gt(0, 'must be greater than 0').max(10_000, 'may be at most 10000 mm'),
]);

/** One material of the catalogue as the API answers it. */
export const materialSchema = z.object({
  id: z.number(),
  name: z.string(),
  /** Sheet thickness, mm. */
  thickness: z.number(),
  /** Width the beam burns away, mm. */
  kerf: z.number(),
  /** Typical cutting speed on the space's lasers, mm/s; null when unknown. */
  cuttingSpeed: z.number().nullable(),
  /** kg/m³; null when unknown (used for weight notes on hanging pieces). */
  density: z.number().nullable(),
  /** Stock sheet sizes the space keeps, mm. */
  sheetSizes: z.array(sheetSizeSchema),
  /** True when the material must never go on the laser; `prohibitedReason` then says why. */
  prohibited: z.boolean(),
  prohibitedReason: z.string().nullable(),
  notes: z.string(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Material = z.infer<typeof materialSchema>;

const materialFields = {
  name: z.string().trim().min(1, 'Enter a name').max(120, 'Use at most 120 characters'),
  thickness: z.number().gt(0, 'must be greater than 0').max(50, 'may be at most 50 mm'),
  kerf: z.number().min(0, 'must be 0 or more').max(5, 'may be at most 5 mm'),
  cuttingSpeed: z.number().gt(0, 'must be greater than 0').max(10_000, 'may be at most 10000 mm/s').nullable(),
  density: z.number().gt(0, 'must be greater than 0').max(25_000, 'may be at most 25000 kg/m³').nullable(),
  sheetSizes: z.array(sheetSizeSchema).max(20, 'List at most 20 sheet sizes'),
  prohibited: z.boolean(),
  prohibitedReason: z.string().trim().max(500, 'Use at most 500 characters').nullable(),
  notes: z.string().trim().max(2000, 'Use at most 2000 characters'),
};

const reasonRule = (m: { prohibited?: boolean; prohibitedReason?: string | null }) => !m.prohibited || (m.prohibitedReason ?? '').trim() !== '';
const reasonIssue = { message: 'Say why the material is prohibited', path: ['prohibitedReason'] };

/**
 * `POST /api/materials` (admin). A prohibited material needs a reason (e.g. the gas it releases).
 * Unknown speed and density are null; sheet sizes default to none.
 */
export const createMaterialBodySchema = z
  .object({
    ...materialFields,
    cuttingSpeed: materialFields.cuttingSpeed.default(null),
    density: materialFields.density.default(null),
    sheetSizes: materialFields.sheetSizes.default([]),
    prohibited: materialFields.prohibited.default(false),
    prohibitedReason: materialFields.prohibitedReason.default(null),
    notes: materialFields.notes.default(''),
  })
  .refine(reasonRule, reasonIssue);
export type CreateMaterialBody = z.input<typeof createMaterialBodySchema>;

/**
 * `PATCH /api/materials/:materialId` (admin): any subset of the fields. Marking a material
 * prohibited needs a reason in the same request unless it already has one (the server checks the
 * merged result and answers 422 at `body.prohibitedReason`).
 */
export const updateMaterialBodySchema = z.object(materialFields).partial();
export type UpdateMaterialBody = z.infer<typeof updateMaterialBodySchema>;

/** One safety caution: a stable id and the sentence to show. */
export interface SafetyCaution {
  readonly id: string;
  readonly text: string;
}

/**
 * The usual laser-cutting cautions (DESIGN.md "Safety"), shown wherever a material is chosen and
 * repeated in the cut pack. They defer to local codes and the space's own rules, which win.
 */
export const SAFETY_CAUTIONS: readonly SafetyCaution[] = [
  { id: 'fire', text: 'Laser cutting can start fires: never leave a running laser unattended, and keep the extinguisher within reach.' },
  { id: 'ventilation', text: 'Run the extraction and air assist for every cut; smoke and fumes are harmful to breathe.' },
  {
    id: 'material-allowed',
    text: 'Check the material is allowed before cutting. Some plastics release toxic gas: PVC and vinyl give off hydrogen chloride, ABS hydrogen cyanide.',
  },
  { id: 'hanging', text: 'Large or hanging pieces: follow local codes for fixings and loads, and the maker space\u2019s own safety rules.' },
  { id: 'local-rules', text: 'These notes do not replace the maker space\u2019s induction and rules, or local codes; where they differ, those win.' },
];

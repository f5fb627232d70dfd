/**
 * The starting catalogue the demo seeds. Kerf values for 3 mm stock are from REFERENCES.md
 * "Laser-cutting practice" (several cutting services; common practice). The prohibited list and
 * its reasons are from the same section (university architecture-school and environmental-health
 * laser-cutter rules). Cutting speeds and densities are marked per row.
 */
import type { CreateMaterialBody } from '../../shared/api/materials.js';

const PLY_SHEETS: [number, number][] = [
  [600, 400],
  [1220, 2440],
];

export const STARTING_CATALOGUE: readonly CreateMaterialBody[] = [
  {
    name: 'Birch plywood 3 mm',
    thickness: 3,
    kerf: 0.2, // REFERENCES.md: birch plywood ≈ 0.20 mm
    cuttingSpeed: 15, // common practice, no source (CO₂ laser, one pass)
    density: 680, // from memory
    sheetSizes: PLY_SHEETS,
    notes: 'Thickness varies by about ±10 % between sheets (common practice): measure before a press-fit run.',
  },
  {
    name: 'MDF 3 mm',
    thickness: 3,
    kerf: 0.15, // REFERENCES.md: MDF ≈ 0.15 mm
    cuttingSpeed: 12, // common practice, no source
    density: 750, // from memory
    sheetSizes: PLY_SHEETS,
    notes: 'Burns with heavy smoke; keep the extraction running.',
  },
  {
    name: 'Acrylic (PMMA) 3 mm',
    thickness: 3,
    kerf: 0.23, // REFERENCES.md: acrylic ≈ 0.23 mm
    cuttingSpeed: 8, // common practice, no source
    density: 1180, // from memory
    sheetSizes: [[600, 400]],
    notes: 'Cast acrylic cuts with a polished edge; flammable — never leave the laser running unattended.',
  },
  {
    name: 'Card 1.5 mm',
    thickness: 1.5,
    kerf: 0.1, // common practice, no source (REFERENCES.md gives 0.08–0.45 mm overall)
    cuttingSpeed: 40, // common practice, no source
    density: 700, // from memory
    sheetSizes: [[594, 420]], // ISO 216 A2
    notes: 'Good for quick studies before cutting wood.',
  },
  {
    name: 'PVC / vinyl',
    thickness: 3,
    kerf: 0.2,
    prohibited: true,
    prohibitedReason: 'Releases hydrogen chloride gas when cut, which is toxic and corrodes the laser.',
  },
  {
    name: 'Polycarbonate',
    thickness: 3,
    kerf: 0.2,
    prohibited: true,
    prohibitedReason: 'Melts and catches fire instead of cutting cleanly, with harmful fumes.',
  },
  {
    name: 'ABS',
    thickness: 3,
    kerf: 0.2,
    prohibited: true,
    prohibitedReason: 'Releases hydrogen cyanide when cut, and melts into a sticky residue.',
  },
  {
    name: 'Fibre-glass and carbon-fibre composites',
    thickness: 2,
    kerf: 0.2,
    prohibited: true,
    prohibitedReason: 'The resin releases toxic fumes and the fibres give harmful dust.',
  },
  {
    name: 'PTFE',
    thickness: 2,
    kerf: 0.2,
    prohibited: true,
    prohibitedReason: 'Releases toxic fluorine compounds when heated.',
  },
  {
    name: 'Polystyrene foam',
    thickness: 5,
    kerf: 0.3,
    prohibited: true,
    prohibitedReason: 'Catches fire easily and melts; a fire risk in the laser.',
  },
];

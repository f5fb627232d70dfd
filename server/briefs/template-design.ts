/**
 * A design document made from a brief, for its drawing templates: the brief's first allowed
 * group, one family per required or allowed family rule of that group (at the middle of the
 * rule's offset range), the brief's material, no motifs yet.
 */
import type { BriefConstraints, FamilyRule } from '../../shared/api/briefs.js';
import { DESIGN_FORMAT } from '../../shared/engine/design.js';
import type { BriefMaterial } from '../audits/brief-rules.js';

export interface TemplateFamily {
  id: string;
  label: string;
}

export function templateFamiliesOf(c: BriefConstraints): { group: string; families: { id: string; rule: FamilyRule; label: string }[] } {
  const group = c.allowedGroups[0];
  const used = new Set<string>();
  const families: { id: string; rule: FamilyRule; label: string }[] = [];
  for (const rule of [...c.requiredFamilies, ...c.allowedFamilies]) {
    if (rule.group !== undefined && rule.group !== group) continue;
    const base = rule.axis !== undefined ? `fold-${rule.axis}` : 'normal';
    let id = base;
    for (let k = 2; used.has(id); k++) id = `${base}-${k}`;
    used.add(id);
    const offset = (rule.offsetMin + rule.offsetMax) / 2;
    const dir = rule.axis !== undefined ? `square to a ${rule.axis}-fold axis` : `normal (${rule.normal!.join(', ')})`;
    families.push({ id, rule, label: `Planes ${dir} of ${group} at ${offset} mm` });
  }
  return { group, families };
}

export function templateDesignOf(title: string, c: BriefConstraints, material: BriefMaterial): object {
  const { group, families } = templateFamiliesOf(c);
  return {
    format: DESIGN_FORMAT,
    title: title.slice(0, 200) || 'Brief',
    symmetry: group,
    material: { name: material.name, thickness: material.thickness, kerf: material.kerf },
    families: families.map((f) => ({
      id: f.id,
      ...(f.rule.axis !== undefined ? { axis: f.rule.axis } : { normal: f.rule.normal }),
      offset: (f.rule.offsetMin + f.rule.offsetMax) / 2,
    })),
    motifs: [],
    constraints: { sheet: c.sheet, maxSheets: c.maxSheets, angleToleranceDeg: c.angleToleranceDeg },
  };
}

import type { BriefConstraints, BriefState, FamilyRule, LatePolicy } from '../../../../shared/api/briefs.js';

const GROUP_WORDS: Record<string, string> = { T: 'tetrahedral', O: 'octahedral', I: 'icosahedral' };

/** "I (icosahedral)", "D5 (dihedral, order 10)", "C3 (cyclic, order 3)". */
export function describeGroup(name: string): string {
  if (GROUP_WORDS[name]) return `${name} (${GROUP_WORDS[name]})`;
  const m = /^([CD])(\d+)$/.exec(name);
  if (!m) return name;
  const n = Number(m[2]);
  return m[1] === 'C' ? `${name} (cyclic, order ${n})` : `${name} (dihedral, order ${2 * n})`;
}

function formatNumber(n: number): string {
  return Number.isInteger(n) ? String(n) : String(Math.round(n * 1000) / 1000);
}

/** One family rule in words: "planes square to the 2-fold axes of I, 80–140 mm from the centre". */
export function describeFamilyRule(rule: FamilyRule): string {
  const plane =
    rule.axis !== undefined
      ? `planes square to the ${rule.axis}-fold axes${rule.group ? ` of ${rule.group}` : ''}`
      : `planes with normal (${(rule.normal ?? []).map(formatNumber).join(', ')})${rule.group ? ` under ${rule.group}` : ''}`;
  const offset =
    rule.offsetMin === rule.offsetMax
      ? `${formatNumber(rule.offsetMin)} mm from the centre`
      : `${formatNumber(rule.offsetMin)}–${formatNumber(rule.offsetMax)} mm from the centre`;
  return `${plane}, ${offset}`;
}

export const LATE_POLICY_WORDS: Record<LatePolicy, string> = {
  accept: 'Revisions after the deadline are accepted as usual.',
  'accept-marked-late': 'Revisions after the deadline are accepted and marked late.',
  refuse: 'Revisions after the deadline are refused.',
};

export const LATE_POLICY_LABELS: Record<LatePolicy, string> = {
  accept: 'Accept as usual',
  'accept-marked-late': 'Accept, marked late',
  refuse: 'Refuse',
};

export const BRIEF_STATE_LABELS: Record<BriefState, string> = { draft: 'Draft', published: 'Published', closed: 'Closed' };

/** The constraints as sentences a participant reads before drawing. */
export function describeConstraints(c: BriefConstraints, material: { name: string; thickness: number; kerf: number } | null): string[] {
  const lines: string[] = [];
  lines.push(
    c.allowedGroups.length === 1
      ? `Use the symmetry group ${describeGroup(c.allowedGroups[0])}.`
      : `Use one of the symmetry groups ${c.allowedGroups.map(describeGroup).join(', ')}.`,
  );
  if (c.requiredFamilies.length) {
    lines.push(`Required: ${c.requiredFamilies.map(describeFamilyRule).join('; ')}.`);
  }
  if (c.allowedFamilies.length) {
    lines.push(`Other families allowed: ${c.allowedFamilies.map(describeFamilyRule).join('; ')}.`);
  } else if (c.requiredFamilies.length) {
    lines.push('No families other than the required ones.');
  } else {
    lines.push('Any family of planes is allowed.');
  }
  lines.push(
    material
      ? `Material: ${material.name}, ${formatNumber(material.thickness)} mm thick, kerf ${formatNumber(material.kerf)} mm.`
      : 'Material: not chosen yet.',
  );
  lines.push(`At most ${c.maxSheets} ${c.maxSheets === 1 ? 'sheet' : 'sheets'} of ${formatNumber(c.sheet[0])} × ${formatNumber(c.sheet[1])} mm.`);
  lines.push(`Joints must be square within ${formatNumber(c.angleToleranceDeg)}°.`);
  lines.push(
    c.minJointLength !== undefined
      ? `Joints at least ${formatNumber(c.minJointLength)} mm long.`
      : 'Joints at least twice the material thickness long.',
  );
  if (c.pieceCount) lines.push(`Between ${c.pieceCount.min} and ${c.pieceCount.max} pieces.`);
  return lines;
}

/** The folds of a group's rotation axes (FORMAT.md canonical normals); empty for an unknown name. */
export function axisFolds(group: string): number[] {
  if (group === 'I') return [2, 3, 5];
  if (group === 'O') return [2, 3, 4];
  if (group === 'T') return [2, 3];
  const m = /^([CD])(\d+)$/.exec(group);
  if (!m) return [];
  const n = Number(m[2]);
  return m[1] === 'C' ? [n] : [...new Set([2, n])].sort((a, b) => a - b);
}

/** Groups among `groups` that have no axis of this fold (a rule for them could never match). */
export function groupsWithoutFold(groups: readonly string[], fold: number): string[] {
  return groups.filter((g) => !axisFolds(g).includes(fold));
}

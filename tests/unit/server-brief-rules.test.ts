// The brief's own checks on a design (server/audits/brief-rules.ts) and the CSV cells of the
// marks export. Expected values are worked by hand from FORMAT.md's canonical orientations.
import { describe, expect, it } from 'vitest';
import type { BriefConstraints } from '../../shared/api/briefs.js';
import { auditAgainstBrief, familyMatches } from '../../server/audits/brief-rules.js';
import { csvCell, toCsv } from '../../server/briefs/csv.js';
import { getGroup } from '../../shared/engine/groups.js';

const I = getGroup('I');
const family = (normal: [number, number, number], offset: number, axis: number | null = null) => ({ id: 'f', axis, normal, offset });

describe('familyMatches', () => {
  it('when the family is given by an explicit normal on another 2-fold plane of I, it matches the 2-fold rule', () => {
    // FORMAT.md: the coordinate axes of I are 2-fold, so x is a 2-fold axis like the canonical z.
    expect(familyMatches(family([1, 0, 0], 50), { axis: 2, offsetMin: 40, offsetMax: 60 }, I, 0.5)).toBe(true);
    expect(familyMatches(family([1, 0, 0], 50), { axis: 3, offsetMin: 40, offsetMax: 60 }, I, 0.5)).toBe(false);
  });

  it('when the normal points the opposite way it still matches (n and −n)', () => {
    const n = Math.sqrt(1 / 3);
    expect(familyMatches(family([-n, -n, -n], 50), { axis: 3, offsetMin: 0, offsetMax: 100 }, I, 0.5)).toBe(true);
  });

  it('when the offset is outside the range, or the rule names another group, it does not match', () => {
    expect(familyMatches(family([0, 0, 1], 61, 2), { axis: 2, offsetMin: 40, offsetMax: 60 }, I, 0.5)).toBe(false);
    expect(familyMatches(family([0, 0, 1], 60.0005, 2), { axis: 2, offsetMin: 40, offsetMax: 60 }, I, 0.5)).toBe(true);
    expect(familyMatches(family([0, 0, 1], 50, 2), { group: 'O', axis: 2, offsetMin: 40, offsetMax: 60 }, I, 0.5)).toBe(false);
  });

  it('when the rule gives a normal, matching honours the angle tolerance', () => {
    const tilt = (deg: number): [number, number, number] => [Math.sin((deg * Math.PI) / 180), 0, Math.cos((deg * Math.PI) / 180)];
    // 0.3° off the z axis (a 2-fold axis of I): inside a 0.5° tolerance, outside 0.1°.
    expect(familyMatches(family(tilt(0.3), 50), { normal: [0, 0, 1], offsetMin: 0, offsetMax: 100 }, I, 0.5)).toBe(true);
    expect(familyMatches(family(tilt(0.3), 50), { normal: [0, 0, 1], offsetMin: 0, offsetMax: 100 }, I, 0.1)).toBe(false);
  });
});

const plates = {
  format: 'planewright/design@1',
  title: 'Plates',
  symmetry: 'O',
  material: { name: 'Card', thickness: 1.5, kerf: 0.1 },
  families: [{ id: 'faces', axis: 4, offset: 50 }],
  motifs: [{ id: 'plate', family: 'faces', outline: [[-50, -50], [50, -50], [50, 50], [-50, 50]] }],
};
const base: BriefConstraints = { allowedGroups: ['O'], requiredFamilies: [], allowedFamilies: [], materialId: 1, sheet: [600, 400], maxSheets: 2, angleToleranceDeg: 0.5 };
const ply = { name: 'Birch plywood 3 mm', thickness: 3, kerf: 0.2 };

describe('auditAgainstBrief', () => {
  it('when the design\u2019s material differs, the brief\u2019s wins and a warning says what changed', () => {
    const r = auditAgainstBrief({ design: plates, constraints: base, material: ply });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.report.material).toEqual(ply);
    const w = r.report.findings.find((f) => f.code === 'material-replaced');
    expect(w?.severity).toBe('warning');
    expect(w?.message).toContain('thickness 1.5 → 3 mm, kerf 0.1 → 0.2 mm');
    expect(r.report.ok).toBe(true);
    expect(r.figures).toMatchObject({ pieces: 6, joints: 12, warnings: 1, errors: 0 });
  });

  it('when the piece count is outside the brief\u2019s range, it is an error and the report is not ok', () => {
    const r = auditAgainstBrief({ design: { ...plates, material: { name: 'P', thickness: 3, kerf: 0.2 } }, constraints: { ...base, pieceCount: { min: 8, max: 20 } }, material: ply });
    expect(r.ok && r.report.findings.map((f) => [f.code, f.severity])).toEqual([['piece-count-out-of-range', 'error']]);
    expect(r.ok && r.report.ok).toBe(false);
  });

  it('when a family matches no rule, the finding names the family and lists its pieces', () => {
    const r = auditAgainstBrief({ design: plates, constraints: { ...base, allowedFamilies: [{ axis: 3, offsetMin: 10, offsetMax: 90 }] }, material: ply });
    const f = r.ok ? r.report.findings.find((x) => x.code === 'family-not-allowed') : undefined;
    expect(f?.message).toMatch(/family "faces" \(square to the 4-fold axis, offset 50 mm\)/);
    expect(f?.pieces).toHaveLength(6);
  });

  it('when the stored document is not a design, it says so instead of throwing', () => {
    const r = auditAgainstBrief({ design: { format: 'planewright/design@1' }, constraints: base, material: ply });
    expect(r).toEqual({ ok: false, error: expect.stringMatching(/^The design could not be read: /) });
  });
});

describe('csvCell', () => {
  it('quotes commas, quotes and line breaks, and guards cells that a spreadsheet would run as formulas', () => {
    expect(csvCell('plain')).toBe('plain');
    expect(csvCell('a,b')).toBe('"a,b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell('=SUM(A1)')).toBe("'=SUM(A1)");
    expect(csvCell('+1')).toBe("'+1");
    expect(csvCell('-1')).toBe("'-1");
    expect(csvCell('@cmd')).toBe("'@cmd");
    expect(csvCell('=a,b')).toBe(`"'=a,b"`);
    expect(csvCell(-3)).toBe('-3');
    expect(csvCell(null)).toBe('');
    expect(csvCell(Number.NaN)).toBe('');
  });

  it('writes a byte-order mark and CRLF after every row', () => {
    expect(toCsv(['a', 'b'], [[1, 'x']])).toBe('\uFEFFa,b\r\n1,x\r\n');
  });
});

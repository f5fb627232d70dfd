// The demo designs in server/seed/designs/ audit to the outcomes their README states.
// This is a regression check of the project's own values (the README's figures are this engine's
// output, checked there against counts derived by hand), not an outside check: it makes sure an
// engine change that breaks the demo — a passing lantern that starts failing, a failing one that
// fails for another reason — is caught before the seed shows it to a studio.
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { audit } from '../../shared/engine/audit.js';
import { parseDesignText } from '../../shared/engine/design.js';
import type { JointKind } from '../../shared/engine/model.js';
import { PHI, expectClose } from './support.js';

const DIR = join(import.meta.dirname, '../../server/seed/designs');

interface BriefLimits {
  sheet: [number, number];
  maxSheets: number;
  angleToleranceDeg: number;
  minJointLength: number;
}
interface Expected {
  brief: string;
  ok: boolean;
  pieces: number;
  templates: number;
  components: number;
  sheets: number;
  byKind: Record<JointKind, number>;
  nonOrthogonal: number;
  errors: string[];
  warnings: string[];
}
interface ExpectedBlock {
  briefs: Record<string, BriefLimits>;
  designs: Record<string, Expected>;
}

/** The last ```json block of the README: the outcomes it states. */
function readmeOutcomes(): ExpectedBlock {
  const text = readFileSync(join(DIR, 'README.md'), 'utf8');
  const blocks = [...text.matchAll(/```json\n([\s\S]*?)\n```/g)];
  if (blocks.length === 0) throw new Error('server/seed/designs/README.md has no ```json block of expected outcomes');
  return JSON.parse(blocks[blocks.length - 1][1]) as ExpectedBlock;
}

const expected = readmeOutcomes();
const files = readdirSync(DIR).filter((f) => f.endsWith('.json')).sort();

function auditFile(name: string) {
  const parsed = parseDesignText(readFileSync(join(DIR, `${name}.json`), 'utf8'));
  if (!parsed.ok) throw new Error(`${name}.json does not parse: ${JSON.stringify(parsed.errors)}`);
  const want = expected.designs[name];
  const limits = expected.briefs[want.brief];
  return { design: parsed.design, report: audit(parsed.design, limits), limits, want };
}

describe('demo designs', () => {
  it('every design file has a stated outcome, and every stated outcome has a file', () => {
    expect(files.length).toBeGreaterThanOrEqual(5);
    expect(files.map((f) => f.replace(/\.json$/, ''))).toEqual(Object.keys(expected.designs).sort());
  });

  it('each brief has at least one design that passes and one that fails', () => {
    for (const brief of Object.keys(expected.briefs)) {
      const outcomes = Object.values(expected.designs).filter((d) => d.brief === brief).map((d) => d.ok);
      expect(outcomes, brief).toContain(true);
      expect(outcomes, brief).toContain(false);
    }
  });

  for (const name of Object.keys(expected.designs)) {
    describe(name, () => {
      it('parses, in the demo material, carrying the brief limits in its own constraints', () => {
        const { design, limits } = auditFile(name);
        expect(design.material).toEqual({ name: 'Birch plywood', thickness: 3, kerf: 0.2 });
        expect(design.constraints.sheet).toEqual(limits.sheet);
        expect(design.constraints.maxSheets).toBe(limits.maxSheets);
      });

      it('audits to the README outcome', () => {
        const { report, want } = auditFile(name);
        const codes = (severity: string) => [...new Set(report.findings.filter((f) => f.severity === severity).map((f) => f.code))].sort();
        expect({
          ok: report.ok,
          pieces: report.pieces,
          templates: report.templates,
          components: report.components,
          sheets: report.sheets?.count,
          byKind: report.summary.byKind,
          nonOrthogonal: report.summary.nonOrthogonal,
          errors: codes('error'),
          warnings: codes('warning'),
        }).toEqual({
          ok: want.ok,
          pieces: want.pieces,
          templates: want.templates,
          components: want.components,
          sheets: want.sheets,
          byKind: want.byKind,
          nonOrthogonal: want.nonOrthogonal,
          errors: want.errors,
          warnings: want.warnings,
        });
        expect(report.summary.joints).toBe(report.joints.length);
      });
    });
  }

  it('the passing designs join every piece at 90° with mortises at least 6 mm long', () => {
    for (const name of ['i-keel-lantern', 'o-facet-lamp']) {
      const { report } = auditFile(name);
      expect(report.joints.length, name).toBeGreaterThan(0);
      for (const j of report.joints) {
        expect(j.orthogonal, `${name} ${j.a}–${j.b}`).toBe(true);
        expect(j.length, `${name} ${j.a}–${j.b}`).toBeGreaterThanOrEqual(6);
      }
    }
  });

  it('the closed shell: neighbouring panels meet along the whole icosahedron edge at 41.8°', () => {
    // Derived by hand (README "Counts derived by hand"): inradius r = 120 mm gives edge
    // a = 2√3 r / φ² ≈ 158.8 mm; adjacent 3-fold planes are arccos(√5/3) ≈ 41.81° apart.
    const { report } = auditFile('i-closed-shell');
    const edgeContacts = report.joints.filter((j) => !j.orthogonal && Math.abs(j.angleDeg - 41.81) < 0.01);
    expect(edgeContacts).toHaveLength(30);
    for (const j of edgeContacts) expectClose(j.length, (2 * Math.sqrt(3) * 120) / (PHI * PHI), 0.05, `${j.a}–${j.b} length`);
    expectClose(edgeContacts[0].angleDeg, (Math.acos(Math.sqrt(5) / 3) * 180) / Math.PI, 0.01, 'angle');
  });
});

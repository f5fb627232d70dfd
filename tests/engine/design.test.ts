// The design document parser (FORMAT.md §1). Canonical normals are checked against the
// FORMAT.md table written out by hand here (φ = (1 + √5)/2), not against groups.ts.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { MAX_DESIGN_BYTES, formatPath, locateJsonError, parseDesign, parseDesignText } from '../../shared/engine/design.js';
import { polygonArea, signedArea } from '../../shared/engine/polygons.js';
import { PHI, expectClose, expectVecClose } from './support.js';

/** The example of FORMAT.md §1. */
const example = () => ({
  format: 'planewright/design@1',
  title: 'Lantern study 2',
  symmetry: 'I',
  material: { name: 'Birch plywood', thickness: 3, kerf: 0.15 },
  families: [
    { id: 'ribs', axis: 2, offset: 120 },
    { id: 'caps', axis: 3, offset: 140 },
    { id: 'free', normal: [0.2, 0.5, 0.84], offset: 90 },
  ],
  motifs: [
    { id: 'rib', family: 'ribs', outline: [[-40, -10], [40, -10], [40, 10], [-40, 10]], holes: [[[-5, -2], [5, -2], [5, 2], [-5, 2]]] },
    { id: 'cap', family: 'caps', svgPath: 'M -20 0 A 20 20 0 1 0 20 0 A 20 20 0 1 0 -20 0 Z' },
  ],
  constraints: { sheet: [600, 400], maxSheets: 4, angleToleranceDeg: 0.5, minJointLength: 6 },
});

type Doc = ReturnType<typeof example> & Record<string, any>;
const withChange = (f: (d: Doc) => void): Doc => {
  const d = example() as Doc;
  f(d);
  return d;
};
const errorsOf = (input: unknown) => {
  const r = parseDesign(input);
  expect(r.ok).toBe(false);
  return r.ok ? [] : r.errors;
};

describe('parseDesign', () => {
  describe('the FORMAT.md example', () => {
    const r = parseDesign(example());
    it('resolves', () => expect(r.ok).toBe(true));
    if (!r.ok) return;
    const d = r.design;
    it('turns axis 2 of I into (0, 0, 1) and axis 3 into (1, 1, 1)/√3', () => {
      expectVecClose(d.families[0].normal, [0, 0, 1]);
      expectVecClose(d.families[1].normal, [1, 1, 1].map((x) => x / Math.sqrt(3)));
      expect(d.families[0].axis).toBe(2);
    });
    it('normalises an explicit normal and records axis null', () => {
      const n = Math.hypot(0.2, 0.5, 0.84);
      expectVecClose(d.families[2].normal, [0.2 / n, 0.5 / n, 0.84 / n]);
      expect(d.families[2].axis).toBeNull();
    });
    it('keeps the rib with its hole: area 80·20 − 10·4 = 1560', () => {
      expect(polygonArea(d.motifs[0].polygon)).toBe(1560);
      expect(signedArea(d.motifs[0].polygon.outer)).toBeGreaterThan(0);
      expect(signedArea(d.motifs[0].polygon.holes[0])).toBeLessThan(0);
    });
    it('flattens the cap circle to within 0.05 mm (area close to π·20²)', () => {
      const a = polygonArea(d.motifs[1].polygon);
      expect(a).toBeLessThanOrEqual(Math.PI * 400);
      expect(a).toBeGreaterThan(Math.PI * 400 - 2 * Math.PI * 20 * 0.05);
    });
    it('carries material and constraints', () => {
      expect(d.material).toEqual({ name: 'Birch plywood', thickness: 3, kerf: 0.15 });
      expect(d.constraints).toEqual({ sheet: [600, 400], maxSheets: 4, angleToleranceDeg: 0.5, minJointLength: 6 });
    });
  });

  it('defaults kerf to 0 and constraints to none', () => {
    const r = parseDesign(withChange((d) => {
      delete (d.material as any).kerf;
      delete (d as any).constraints;
    }));
    expect(r.ok && r.design.material.kerf).toBe(0);
    expect(r.ok && r.design.constraints).toEqual({});
  });

  it('gives the canonical normal of the 5-fold axis of I as (0, 1, φ) normalised', () => {
    const r = parseDesign(withChange((d) => (d.families[0].axis = 5)));
    const n = Math.hypot(1, PHI);
    expect(r.ok).toBe(true);
    if (r.ok) expectVecClose(r.design.families[0].normal, [0, 1 / n, PHI / n]);
  });

  it('accepts a design with no motifs yet (families planned, nothing drawn)', () => {
    expect(parseDesign(withChange((d) => (d.motifs = []))).ok).toBe(true);
  });

  describe('input errors name the field and the problem', () => {
    it.each<[string, (d: Doc) => void, string, RegExp]>([
      ['a wrong format', (d) => (d.format = 'planewright/design@2'), 'format', /planewright\/design@1/],
      ['an unknown group', (d) => (d.symmetry = 'K7'), 'symmetry', /unknown symmetry group "K7"/],
      ['a fold the group lacks', (d) => (d.families[0].axis = 4), 'families[0].axis', /no 4-fold axis/],
      ['a zero normal', (d) => (d.families[2].normal = [0, 0, 0]), 'families[2].normal', /non-zero/],
      ['both axis and normal', (d) => ((d.families[0] as any).normal = [1, 0, 0]), 'families[0]', /exactly one/],
      ['a negative offset', (d) => (d.families[0].offset = -1), 'families[0].offset', /0 or more/],
      ['a duplicate family id', (d) => (d.families[1].id = 'ribs'), 'families[1].id', /duplicate family id "ribs"/],
      ['an unknown family on a motif', (d) => (d.motifs[1].family = 'lids'), 'motifs[1].family', /unknown family "lids"/],
      ['a duplicate motif id', (d) => (d.motifs[1].id = 'rib'), 'motifs[1].id', /duplicate motif id/],
      ['zero thickness', (d) => (d.material.thickness = 0), 'material.thickness', /greater than 0/],
      ['a 60 mm thickness', (d) => (d.material.thickness = 60), 'material.thickness', /at most 50/],
      ['a negative kerf', (d) => (d.material.kerf = -0.1), 'material.kerf', /0 or more/],
      ['a text thickness', (d) => ((d.material as any).thickness = '3'), 'material.thickness', /must be a number, not text/],
      ['a missing title', (d) => delete (d as any).title, 'title', /required/],
      ['an unknown key (typo)', (d) => ((d.motifs[0] as any).hole = []), 'motifs[0]', /unknown key "hole"/],
      ['outline and svgPath together', (d) => ((d.motifs[1] as any).outline = [[0, 0], [1, 0], [0, 1]]), 'motifs[1]', /exactly one/],
      ['a coordinate beyond 10,000 mm', (d) => (d.motifs[0].outline![1] = [40000, -10]), 'motifs[0].outline[1][0]', /±10000/],
      ['a point with one number', (d) => ((d.motifs[0].outline as any)[2] = [5]), 'motifs[0].outline[2]', /at least 2|items/],
      ['a bow-tie outline', (d) => (d.motifs[0].outline = [[0, 0], [10, 0], [0, 10], [10, 10]]), 'motifs[0].outline[1]', /crosses itself/],
      ['two points', (d) => (d.motifs[0].outline = [[0, 0], [10, 0]]), 'motifs[0].outline', /at least 3/],
      ['an open svgPath', (d) => (d.motifs[1].svgPath = 'M 0 0 L 10 0 L 10 10'), 'motifs[1].svgPath', /open/],
      ['a broken svgPath', (d) => (d.motifs[1].svgPath = 'M 0 0 Q'), 'motifs[1].svgPath', /path data/],
      ['a hole outside', (d) => (d.motifs[0].holes = [[[50, 0], [55, 0], [55, 5]]]), 'motifs[0].holes[0]', /not inside/],
      ['a sheet of zero width', (d) => (d.constraints.sheet = [0, 400]), 'constraints.sheet[0]', /greater than 0/],
      ['a fractional maxSheets', (d) => (d.constraints.maxSheets = 1.5), 'constraints.maxSheets', /whole number/],
      ['too many motifs', (d) => (d.motifs = Array.from({ length: 201 }, (_, i) => ({ ...d.motifs[0], id: `m${i}` }))), 'motifs', /at most 200/],
      ['too many families', (d) => (d.families = Array.from({ length: 21 }, (_, i) => ({ id: `f${i}`, axis: 2, offset: 10 }))), 'families', /at most 20/],
    ])('when the design has %s', (_, change, path, message) => {
      const errors = errorsOf(withChange(change));
      const hit = errors.find((e) => e.path === path);
      expect(hit, `no issue at ${path}; got ${JSON.stringify(errors)}`).toBeDefined();
      expect(hit!.message).toMatch(message);
    });

    it('reports every problem at once, not only the first', () => {
      const errors = errorsOf(withChange((d) => {
        d.families[0].axis = 4;
        d.motifs[1].family = 'nope';
      }));
      expect(errors.map((e) => e.path).sort()).toEqual(['families[0].axis', 'motifs[1].family']);
    });

    it('refuses more than 5,000 points after flattening a path', () => {
      // A circle of radius 9,000 mm flattened to 0.05 mm needs ≈ π/acos(1 − 0.05/9000) ≈ 940 chords
      // per half, so ten such circles stacked as holes still fit; one 5,001-point polygon does not.
      const pts = Array.from({ length: 5001 }, (_, i) => [100 * Math.cos((2 * Math.PI * i) / 5001), 100 * Math.sin((2 * Math.PI * i) / 5001)]);
      const errors = errorsOf(withChange((d) => (d.motifs[0] = { id: 'rib', family: 'ribs', outline: pts } as any)));
      expect(errors[0].path).toBe('motifs[0].outline');
      expect(errors[0].message).toMatch(/at most 5000/);
    });

    it('treats input that is not an object as an issue', () => {
      expect(errorsOf(null)[0].message).toMatch(/must be an object/);
      expect(errorsOf([1, 2])[0].message).toMatch(/must be an object, not a list/);
    });

    it('never throws on a hostile object (a getter that throws)', () => {
      const evil = example() as any;
      Object.defineProperty(evil, 'title', { enumerable: true, get: () => { throw new Error('boom'); } });
      const r = parseDesign(evil);
      expect(r.ok).toBe(false);
    });
  });
});

describe('parseDesignText', () => {
  it('reads the fixture designs', () => {
    for (const f of ['d4-fins-deck', 'o-cube-plates', 'o-cross-merge', 'o-tabs-apart', 'i-two-families']) {
      const r = parseDesignText(readFileSync(new URL(`../fixtures/designs/${f}.json`, import.meta.url), 'utf8'));
      expect(r.ok, `${f}: ${JSON.stringify(!r.ok && r.errors)}`).toBe(true);
    }
  });
  it('gives line and column of bad JSON', () => {
    const r = parseDesignText('{\n  "format": "planewright/design@1",\n  "title": }');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].message).toMatch(/line 3, column 12/);
  });
  it('places an unterminated document at its end', () => {
    const r = parseDesignText('{\n  "a": [1, 2');
    expect(!r.ok && r.errors[0].message).toMatch(/line 2, column 13/);
  });
  it('accepts a byte-order mark', () => {
    expect(parseDesignText('\ufeff' + JSON.stringify(example())).ok).toBe(true);
  });
  it('refuses text over 2 MB before parsing it', () => {
    const r = parseDesignText(' '.repeat(MAX_DESIGN_BYTES + 1));
    expect(!r.ok && r.errors[0].message).toMatch(/larger than 2 MB/);
  });
  it('counts bytes, not characters (multi-byte text over the limit)', () => {
    const r = parseDesignText(JSON.stringify({ ...example(), title: 'é'.repeat(MAX_DESIGN_BYTES / 2 + 10) }));
    expect(!r.ok && r.errors[0].message).toMatch(/larger than 2 MB/);
  });
  it('says so when the file is empty', () => {
    expect(!parseDesignText('   ').ok && (parseDesignText('  ') as any).errors[0].message).toMatch(/empty/);
  });
});

describe('formatPath', () => {
  it('joins keys with dots and indices with brackets', () => {
    expect(formatPath(['motifs', 2, 'outline', 5])).toBe('motifs[2].outline[5]');
    expect(formatPath([])).toBe('');
  });
});

describe('locateJsonError', () => {
  it.each([
    ['{"a":[1,2,{"b":null}]}', null],
    ['[1,2', 4],
    ['{"a" 1}', 5],
    ['[1,]', 3],
    ['01', 1],
    ['{}x', 2],
  ])('%j → %j', (text, at) => {
    expect(locateJsonError(text)).toBe(at);
    expect(at === null).toBe((() => { try { JSON.parse(text); return true; } catch { return false; } })());
  });
  it('does not overflow the stack on deep nesting', () => {
    expect(locateJsonError('['.repeat(200_000) + ']'.repeat(200_000))).toBeNull();
  });
});

describe('coordinates in range', () => {
  it('accepts ±10,000 exactly', () => {
    const r = parseDesign(withChange((d) => (d.motifs[0].outline = [[-10000, -10], [10000, -10], [10000, 10], [-10000, 10]])));
    expect(r.ok).toBe(true);
    if (r.ok) expectClose(polygonArea(r.design.motifs[0].polygon), 400000 - 40, 1e-6);
  });
});

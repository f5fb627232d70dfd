// DXF import. Unit codes are checked against the AutoCAD system-variable reference for INSUNITS
// (REFERENCES.md "Exchange formats": 1 inches, 4 millimetres, 5 centimetres, 6 metres); the
// inch is 25.4 mm exactly (international yard and pound agreement, 1959). Inputs are written
// with dxf-writer, or by hand where a case needs exact group codes.
import Drawing from 'dxf-writer';
import { describe, expect, it } from 'vitest';
import { dxfToPolygon, parseDxf } from '../../shared/engine/dxf.js';
import { bounds, polygonArea } from '../../shared/engine/polygons.js';
import { expectClose } from './support.js';

type Unit = 'Unitless' | 'Inches' | 'Millimeters' | 'Centimeters' | 'Meters';
function rectDxf(unit: Unit, w: number, h: number): string {
  const d = new Drawing();
  d.setUnits(unit);
  d.drawRect(0, 0, w, h);
  return d.toDxfString();
}

/** A minimal hand-written DXF: header with $INSUNITS and one closed LWPOLYLINE. */
function handDxf(insunits: number | null, pts: [number, number, number?][], closed = true): string {
  const lines = ['0', 'SECTION', '2', 'HEADER'];
  if (insunits !== null) lines.push('9', '$INSUNITS', '70', String(insunits));
  lines.push('0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', '0', 'LWPOLYLINE', '8', 'cut', '90', String(pts.length), '70', closed ? '1' : '0');
  for (const [x, y, b] of pts) {
    lines.push('10', String(x), '20', String(y));
    if (b !== undefined) lines.push('42', String(b));
  }
  lines.push('0', 'ENDSEC', '0', 'EOF');
  return lines.join('\n');
}

const areaOf = (text: string) => {
  const r = dxfToPolygon(text);
  if (!r.ok) throw new Error(r.errors.join('; '));
  return polygonArea(r.polygon);
};

describe('parseDxf', () => {
  describe('$INSUNITS (AutoCAD INSUNITS system-variable reference)', () => {
    it('4 = millimetres: a 100 × 50 rectangle is 5000 mm²', () => expect(areaOf(rectDxf('Millimeters', 100, 50))).toBeCloseTo(5000, 9));
    it('1 = inches: a 4 × 2 in rectangle is 101.6 × 50.8 mm', () => {
      const r = parseDxf(rectDxf('Inches', 4, 2));
      expect(r.ok).toBe(true);
      if (r.ok) {
        const b = bounds(r.rings);
        expectClose(b[2] - b[0], 101.6, 1e-9);
        expectClose(b[3] - b[1], 50.8, 1e-9);
        expect(r.units).toBe('inches');
      }
    });
    it('5 = centimetres: 10 × 5 cm is 5000 mm²', () => expect(areaOf(rectDxf('Centimeters', 10, 5))).toBeCloseTo(5000, 6));
    it('6 = metres: 0.1 × 0.05 m is 5000 mm²', () => expect(areaOf(rectDxf('Meters', 0.1, 0.05))).toBeCloseTo(5000, 6));
    it('0 = unitless is read as millimetres (the project’s documented choice)', () => expect(areaOf(rectDxf('Unitless', 100, 50))).toBeCloseTo(5000, 9));
    it('no $INSUNITS at all is read as millimetres too', () => expect(areaOf(handDxf(null, [[0, 0], [10, 0], [10, 10], [0, 10]]))).toBeCloseTo(100, 9));
    it('an unsupported code is an error naming it', () => {
      const r = parseDxf(handDxf(14, [[0, 0], [10, 0], [10, 10], [0, 10]]));
      expect(!r.ok && r.errors[0]).toMatch(/\$INSUNITS 14 is not supported/);
    });
  });

  it('flattens a bulge of 1 (a half circle, DXF group 42 = tan(θ/4)) within 0.05 mm', () => {
    // Square 20 × 20 whose top edge is replaced by a half circle of radius 10 bulging outward:
    // area 400 + π·10²/2; flattening loses at most perimeter × 0.05 of the half circle.
    const a = areaOf(handDxf(4, [[0, 0], [20, 0], [20, 20, 1], [0, 20]]));
    const exact = 400 + (Math.PI * 100) / 2;
    expect(a).toBeLessThanOrEqual(exact);
    expect(a).toBeGreaterThan(exact - Math.PI * 10 * 0.05);
  });

  it('reads a circle with a hole as outline and hole', () => {
    const d = new Drawing();
    d.setUnits('Millimeters');
    d.drawCircle(0, 0, 30);
    d.drawCircle(0, 0, 10);
    const a = areaOf(d.toDxfString());
    expect(Math.abs(a - Math.PI * (900 - 100))).toBeLessThan(2 * Math.PI * 30 * 0.05 + 2 * Math.PI * 10 * 0.05);
  });

  it('joins LINE and ARC entities into a closed ring (a D shape)', () => {
    const d = new Drawing();
    d.setUnits('Millimeters');
    d.drawLine(0, 0, 10, 0);
    d.drawArc(10, 5, 5, -90, 90);
    d.drawLine(10, 10, 0, 10);
    d.drawLine(0, 0, 0, 10); // drawn the other way round: joining must reverse it
    const a = areaOf(d.toDxfString());
    expect(a).toBeLessThanOrEqual(100 + (Math.PI * 25) / 2);
    expect(a).toBeGreaterThan(100 + (Math.PI * 25) / 2 - Math.PI * 5 * 0.05);
  });

  it('reports an open chain with where it stops', () => {
    const d = new Drawing();
    d.drawLine(0, 0, 10, 0);
    d.drawLine(10, 0, 10, 10);
    const r = parseDxf(d.toDxfString());
    expect(!r.ok && r.errors[0]).toMatch(/starting near \(0, 0\) stop near \(10, 10\)/);
  });

  it('reports a branch', () => {
    const d = new Drawing();
    d.drawLine(0, 0, 10, 0);
    d.drawLine(10, 0, 10, 10);
    d.drawLine(10, 0, 20, 0);
    d.drawLine(10, 10, 0, 0);
    const r = parseDxf(d.toDxfString());
    expect(!r.ok && r.errors.join(' ')).toMatch(/branch/);
  });

  it('refuses splines with a way out', () => {
    // dxf-writer's types omit drawSpline; write the entity by hand (group 71 degree, 10/20 control points).
    const text = handDxf(4, [[0, 0], [1, 0], [1, 1]]).replace(
      '0\nLWPOLYLINE',
      ['0', 'SPLINE', '8', 'cut', '71', '3', '72', '0', '73', '4', '10', '0', '20', '0', '10', '5', '20', '5', '10', '10', '20', '0', '10', '15', '20', '5', '0', 'LWPOLYLINE'].join('\n'),
    );
    const r = parseDxf(text);
    expect(!r.ok && r.errors[0]).toMatch(/SPLINE.*convert/);
  });

  it('reads one layer when asked', () => {
    const d = new Drawing();
    d.addLayer('cut', Drawing.ACI.RED, 'CONTINUOUS');
    d.addLayer('notes', Drawing.ACI.GREEN, 'CONTINUOUS');
    d.setActiveLayer('cut');
    d.drawRect(0, 0, 10, 10);
    d.setActiveLayer('notes');
    d.drawRect(100, 100, 110, 110);
    const r = parseDxf(d.toDxfString(), { layer: 'cut' });
    expect(r.ok && r.rings.length).toBe(1);
  });

  it.each([
    ['not DXF at all', 'hello', /not a DXF file/],
    ['a truncated file', '0\nSECTION\n2\nENTITIES\n0\nLINE\n10\n', /could not be read|no lines/],
    ['an empty drawing', rectDxf('Millimeters', 1, 1).replace(/0\nLWPOLYLINE[\s\S]*?(?=0\nENDSEC\n0\nSECTION\n2\nOBJECTS|0\nENDSEC)/, ''), /no lines|no closed/],
  ])('when the input is %s', (_, text, msg) => {
    const r = parseDxf(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatch(msg);
  });
});

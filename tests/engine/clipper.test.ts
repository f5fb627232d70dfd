// The repair in shared/engine/clipper.ts: clipper2-js 1.2.4 moved the input's own vertices when a
// crossing fell at a segment's end outside the scanbeam. The paths below are a piece (outline and
// a small star-shaped hole) and the ten slots cut into it, in 1 µm units, from a design the
// audit's property tests found: before the repair the difference came out in three parts and the
// input path was changed by the call.
import { describe, expect, it } from 'vitest';
import { Clipper, FillRule, type Path64, type Paths64 } from '../../shared/engine/clipper.js';

const SUBJECT: number[][][] = [
  [[-26275, 6625], [-21875, -6918], [-14374, -4502], [-14420, -22942], [-180, -22942], [-161, -15062], [17363, -20804], [21763, -7261], [14275, -4807], [25151, 10084], [13631, 18454], [8983, 12091], [-1819, 27036], [-13339, 18666], [-8723, 12279]],
  [[-1129, -235], [-261, 45], [-572, 1001], [-38, 262], [775, 853], [238, 117], [1051, -474], [185, -190], [-126, -1146], [-123, -235]],
];

const SLOTS: number[][][] = [
  [[13959, -12183], [13233, -14420], [16086, -15347], [16813, -13111]],
  [[-18455, 1652], [-19181, 3888], [-22035, 2961], [-21308, 724]],
  [[-4132, 18062], [-2229, 19444], [-3993, 21871], [-5895, 20489]],
  [[15901, 9511], [17803, 8129], [19567, 10556], [17664, 11938]],
  [[-7274, -17041], [-9625, -17041], [-9625, -20041], [-7274, -20041]],
  [[14590, -19952], [17411, -11269], [14558, -10341], [11736, -19025]],
  [[-23531, 7566], [-20709, -1118], [-17856, -190], [-20678, 8493]],
  [[-76, 24717], [-7462, 19350], [-5699, 16923], [1688, 22290]],
  [[23484, 7710], [16097, 13077], [14334, 10650], [21721, 5283]],
  [[-14467, -20041], [-5337, -20041], [-5337, -17041], [-14467, -17041]],
];

const paths = (rings: number[][][]): Paths64 => rings.map((r) => r.map(([x, y]) => ({ x, y }))) as unknown as Paths64;
const plain = (p: Paths64): number[][][] => (p as unknown as Path64[]).map((r) => (r as unknown as { x: number; y: number }[]).map((q) => [q.x, q.y]));
/** A quarter turn is exact on integers, so the boolean must give the same areas after it. */
const quarterTurn = (rings: number[][][]): number[][][] => rings.map((r) => r.map(([x, y]) => [-y, x]));
const areas = (p: Paths64): number[] => (p as unknown as Path64[]).map((r) => Clipper.area(r) / 1e6).sort((a, b) => b - a);

describe('clipper2-js with the end-point repair', () => {
  it('leaves the input paths as they were', () => {
    const subject = paths(SUBJECT);
    const slots = paths(SLOTS);
    Clipper.Difference(subject, slots, FillRule.NonZero);
    expect(plain(subject)).toEqual(SUBJECT);
    expect(plain(slots)).toEqual(SLOTS);
  });

  it('cuts the slots out of the piece in one part, whichever way the piece is turned', () => {
    const straight = areas(Clipper.Difference(paths(SUBJECT), paths(SLOTS), FillRule.NonZero));
    const turned = areas(Clipper.Difference(paths(quarterTurn(SUBJECT)), paths(quarterTurn(SLOTS)), FillRule.NonZero));
    // One region of material and the star-shaped hole (negative area), nothing else.
    expect(straight.filter((a) => a > 1e-3)).toHaveLength(1);
    expect(straight).toHaveLength(2);
    expect(turned).toHaveLength(straight.length);
    // Crossings are truncated to whole µm, so areas agree to a few thousandths of a mm², not exactly.
    turned.forEach((a, i) => expect(Math.abs(a - straight[i])).toBeLessThan(0.01));
  });
});

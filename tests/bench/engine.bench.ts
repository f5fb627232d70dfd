// Benchmark of the audit engine (`npm run bench -- --json`). `auditMs` is the whole audit from
// the design (pieces, joints, kinds, components, every finding including the fabrication checks;
// the sheet nesting excluded); `auditWithoutFabricationMs` leaves out the fabrication checks,
// `piecesBuildMs` is the piece builder alone. Targets (single thread): audit of a
// 1,200-piece design under 100 ms (nesting excluded), at least 20× faster than a solid-modelling
// reference that finds the same touching pairs, under 300 ms with nesting, and a re-audit of a
// 180-piece design after one motif changes under 16 ms. Timings are medians after warm-up, as
// wall-clock (`…Ms`) and as CPU time of this process (`…CpuMs`, from process.cpuUsage), which
// stays meaningful when other work loads the machine; `loadAverage` is the 1-minute load.
//
// Design: 20 motifs under I on the planes square to the 2-fold axes (30 planes, offset 60) and
// to the 5-fold axes (12 planes, offset 75), drawn in pairs that meet at right angles along the
// line of two square planes (see pairedMotifs), from a fixed pseudo-random sequence. No motif
// overlaps its own images, so each gives 60 pieces: 1,200 in all; and no motif comes within one
// material thickness of any image of another motif on the same plane, as a participant draws
// them (an earlier generator let them overlap, which raised slab clashes no one would submit).
// A mortise's receiving piece runs past the tenon along the line, so the mortise stays closed.
// Pieces still meet planes they happen to cross at oblique angles and some clusters stay loose:
// the draft of a design, with errors to report, not a finished one.
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { audit, createAuditor } from '../../shared/engine/audit.js';
import { parseDesign } from '../../shared/engine/design.js';
import type { ResolvedDesign } from '../../shared/engine/model.js';
import { buildPieces } from '../../shared/engine/pieces.js';
import { canonicalNormal, getGroup } from '../../shared/engine/groups.js';
import { type PlaneOrbit, planeOrbit } from '../../shared/engine/orbits.js';
import { toFrame } from '../../shared/engine/frames.js';
import { type Vec3, add, cross, dot, normalize, scale } from '../../shared/engine/vec.js';
import { loadManifold, referenceTouchingPairs } from './reference-manifold.js';

const json = process.argv.includes('--json');
const log = (...args: unknown[]): void => {
  if (!json) console.log(...args);
};

function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

const round2 = (x: number): number => Math.round(x * 100) / 100;

type P2 = [number, number];

/** Separating-axis test for two convex polygons: true when they overlap or come within `gap`. */
function convexOverlap(a: P2[], b: P2[], gap = 0): boolean {
  for (const poly of [a, b]) {
    for (let i = 0; i < poly.length; i++) {
      const p = poly[i], q = poly[(i + 1) % poly.length];
      const nx = q[1] - p[1], ny = p[0] - q[0];
      let amin = Infinity, amax = -Infinity, bmin = Infinity, bmax = -Infinity;
      for (const v of a) { const d = v[0] * nx + v[1] * ny; amin = Math.min(amin, d); amax = Math.max(amax, d); }
      for (const v of b) { const d = v[0] * nx + v[1] * ny; bmin = Math.min(bmin, d); bmax = Math.max(bmax, d); }
      const g = gap * Math.hypot(nx, ny) + 1e-6;
      if (amax < bmin - g || bmax < amin - g) return false;
    }
  }
  return true;
}

const applyMap = (m: readonly number[], p: P2): P2 => [m[0] * p[0] + m[1] * p[1], m[2] * p[0] + m[3] * p[1]];
const applyInverse = (m: readonly number[], p: P2): P2 => [m[0] * p[0] + m[2] * p[1], m[1] * p[0] + m[3] * p[1]];

/**
 * 2·pairs motifs that meet at right angles by construction: each pair picks a plane R of one
 * family and a plane Q square to it, a place on the line R ∩ Q, and draws a rectangle on each
 * side of the line — crossing it or ending on it — so their pieces make cross-laps,
 * mortise-and-tenons, through-slots and corners; and the same pieces meet other planes where
 * they happen to cross them (oblique contacts, as a real draft has). Each motif is checked to
 * stay clear of its own images on its plane, so it yields 60 pieces.
 */
function pairedMotifs(pairs: number, seed: number, variant: number): unknown[] {
  const r = rng(seed);
  const group = getGroup('I');
  const fams = [
    { id: 'f2', orbit: planeOrbit(group, canonicalNormal(group, 2), 60) },
    { id: 'f5', orbit: planeOrbit(group, canonicalNormal(group, 5), 75) },
  ];
  const clearOfImages = (orbit: PlaneOrbit, poly: P2[]): boolean =>
    orbit.images.every((im, e) => e === 0 || im.plane !== 0 || !convexOverlap(poly, poly.map((p) => applyMap(im.map, p))));
  const placed: { family: (typeof fams)[number]; poly: P2[] }[] = [];
  const clearOfOthers = (F: (typeof fams)[number], poly: P2[], extra: P2[][]): boolean => {
    const others = [...placed.filter((m) => m.family === F).map((m) => m.poly), ...extra];
    return others.every((o) => F.orbit.images.every((im) => im.plane !== 0 || !convexOverlap(poly, o.map((q) => applyMap(im.map, q)), MOTIF_GAP)));
  };
  const motifs: unknown[] = [];
  let fails = 0;
  while (motifs.length < 2 * pairs) {
    const F = fams[Math.floor(r() * 2)], G = fams[Math.floor(r() * 2)];
    const R = F.orbit.planes[0].frame;
    const perpendicular = G.orbit.planes.filter((q) => Math.abs(dot(q.frame.normal, R.normal)) < 1e-9);
    if (perpendicular.length === 0) continue;
    const Qp = perpendicular[Math.floor(r() * perpendicular.length)];
    const Q = Qp.frame;
    const image = G.orbit.images.find((im) => im.plane === Qp.index)!;
    // The line R ∩ Q and a place on it near the envelope.
    const d = normalize(cross(R.normal, Q.normal));
    const e = cross(R.normal, Q.normal);
    const e2 = dot(e, e);
    const p0 = scale(add(scale(cross(Q.normal, e), R.offset), scale(cross(e, R.normal), Q.offset)), 1 / e2);
    const along = (r() - 0.5) * 120;
    const c = add(p0, scale(d, along));
    if (Math.hypot(...c) > 140) continue;
    // In-plane directions square to the line, pointing away from the other plane's centre side.
    const wR = cross(d, R.normal), wQ = cross(d, Q.normal);
    // Later pairs are drawn smaller once the space near the envelope has filled up.
    const sz = Math.max(0.3, 1 - 0.1 * Math.floor(fails++ / 25));
    const half = 5 + r() * 15;
    const mode = Math.floor(r() * 4); // 0 cross-lap, 1 tenon on R, 2 tab through Q, 3 corner
    const spanR: P2 = mode === 0 ? [-(8 + r() * 20), 4 + r() * 10] : mode === 1 || mode === 3 ? [0, 10 + r() * 25] : [-(6 + r() * 15), 6 + r() * 15];
    const spanQ: P2 = mode === 0 ? [-(4 + r() * 10), 8 + r() * 20] : mode === 3 ? [0, 10 + r() * 25] : [-(15 + r() * 20), 15 + r() * 20];
    // A mortise (mode 1) or through-slot (mode 2) stays closed: Q runs past R along the line.
    const halfQ = mode === 2 ? half + 5 + r() * 15 : mode === 1 ? half + 4 + r() * 10 : half;
    const rect = (w: Vec3, span: P2, h: number): Vec3[] => [
      add(add(c, scale(d, -h)), scale(w, span[0])),
      add(add(c, scale(d, h)), scale(w, span[0])),
      add(add(c, scale(d, h)), scale(w, span[1])),
      add(add(c, scale(d, -h)), scale(w, span[1])),
    ];
    const onR = rect(wR, [spanR[0] * sz, spanR[1] * sz], half * sz).map((p) => toFrame(R, p) as P2);
    const onQ = rect(wQ, [spanQ[0] * sz, spanQ[1] * sz], halfQ * sz).map((p) => applyInverse(image.map, toFrame(Q, p) as P2));
    if (!clearOfImages(F.orbit, onR) || !clearOfImages(G.orbit, onQ)) continue;
    // Clear of every image of the motifs already on the same family's planes (no slab clash) …
    if (!clearOfOthers(F, onR, []) || !clearOfOthers(G, onQ, F === G ? [onR] : [])) continue;
    const k = motifs.length;
    const stretch = variant && k === 0 ? 1 + 0.03 * variant : 1;
    const ccw = (poly: P2[]): number[][] => {
      const area = poly.reduce((s2, p, i) => s2 + p[0] * poly[(i + 1) % poly.length][1] - poly[(i + 1) % poly.length][0] * p[1], 0);
      const ring = area < 0 ? [...poly].reverse() : poly;
      return ring.map((p) => [round2(p[0] * stretch), round2(p[1] * stretch)]);
    };
    const pair = [{ id: `m${k}`, family: F.id, outline: ccw(onR) }, { id: `m${k + 1}`, family: G.id, outline: ccw(onQ) }];
    motifs.push(...pair);
    fails = 0;
    placed.push({ family: F, poly: onR }, { family: G, poly: onQ });
  }
  return motifs;
}

/** Clearance (mm) between motifs on one plane: one material thickness. */
const MOTIF_GAP = 3;

/**
 * The design document of the benchmark lattice (see {@link makeDesign}), as a participant would
 * upload it. Exported for the viewer benchmark.
 */
export function benchDocument(pairs: number, seed: number, variant = 0): { motifs: unknown[] } & Record<string, unknown> {
  return documentOf(pairedMotifs(pairs, seed, variant));
}

function documentOf(motifs: unknown[]): { motifs: unknown[] } & Record<string, unknown> {
  return {
    format: 'planewright/design@1',
    title: 'Benchmark lattice',
    symmetry: 'I',
    material: { name: 'Birch plywood', thickness: 3, kerf: 0.15 },
    families: [{ id: 'f2', axis: 2, offset: 60 }, { id: 'f5', axis: 5, offset: 75 }],
    motifs,
    constraints: { sheet: [1220, 2440] },
  };
}

function designOf(motifs: unknown[]): ResolvedDesign {
  const parsed = parseDesign(documentOf(motifs));
  if (!parsed.ok) throw new Error(`benchmark design invalid: ${JSON.stringify(parsed.errors.slice(0, 3))}`);
  return parsed.design;
}

/**
 * The benchmark lattice: `2·pairs` motifs under I (60 pieces each; `makeDesign(10, 20261201)` gives
 * the 1,200-piece design), drawn from the pseudo-random sequence `seed`; `variant` stretches the
 * first motif (the re-audit runs alternate it). Exported for the viewer benchmark.
 */
export function makeDesign(pairs: number, seed: number, variant = 0): ResolvedDesign {
  return designOf(pairedMotifs(pairs, seed, variant));
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Wall-clock and CPU-time medians (ms) of `runs` calls after `warm` warm-up calls. */
interface Timing {
  wall: number;
  cpu: number;
}

function time(fn: () => void, warm: number, runs: number): Timing {
  for (let i = 0; i < warm; i++) fn();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    fn();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  return { wall: median(wall), cpu: median(cpu) };
}

const r3 = (x: number): number => Math.round(x * 1000) / 1000;

async function mainBench(): Promise<void> {
  const design = makeDesign(10, 20261201);
  const built = buildPieces(design);
  const pieces = built.pieces;
  log(`pieces: ${pieces.length}`);
  if (pieces.length < 1200) throw new Error(`benchmark design has only ${pieces.length} pieces`);

  // The first audit of a fresh process (code still being compiled), then every path warmed
  // until the JIT has settled (the figures kept falling for about 20 rounds), since a worker or
  // a drawing session audits many times.
  const cold = time(() => audit(design, { nesting: false }), 0, 1);
  for (let i = 0; i < 24; i++) {
    audit(design);
    audit(design, { nesting: false, fabrication: false });
  }
  const piecesBuildMs = time(() => buildPieces(design), 2, 9);
  const auditMs = time(() => audit(design, { nesting: false }), 3, 15);
  const auditWithoutFabricationMs = time(() => audit(design, { nesting: false, fabrication: false }), 2, 11);
  const auditWithNestingMs = time(() => audit(design), 2, 9);
  const report = audit(design, { nesting: false });
  log(`joints: ${report.summary.joints}`, report.summary.byKind, `components: ${report.components}`);

  // Re-audit: 180 pieces (2 motifs on 2-fold planes, 1 on 5-fold), alternating one motif's shape.
  const small = [0, 1, 2].map((v) => {
    const d = makeDesign(2, 7, v);
    return { ...d, motifs: d.motifs.slice(0, 3) };
  });
  if (buildPieces(small[0]).pieces.length !== 180) throw new Error('re-audit design should have 180 pieces');
  const auditor = createAuditor();
  auditor.audit(small[0], { nesting: false });
  let v = 0;
  const reauditOneMotifMs = time(() => {
    v = (v + 1) % 3;
    auditor.audit(small[v], { nesting: false });
  }, 30, 31);
  const smallPieces = auditor.audit(small[0], { nesting: false }).pieces;

  // Reference: slabs in manifold-3d, same pruning, same touching rule.
  const wasm = await loadManifold();
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const ref = referenceTouchingPairs(wasm, pieces, design.material.thickness);
  const referenceMs = performance.now() - t0;
  const referenceCpu = process.cpuUsage(c0);
  const referenceCpuMs = (referenceCpu.user + referenceCpu.system) / 1000;
  const engine = new Set(report.joints.map((j) => `${j.a}|${j.b}`));
  const onlyEngine = [...engine].filter((p) => !ref.pairs.has(p));
  const onlyReference = [...ref.pairs].filter((p) => !engine.has(p));
  const agree = onlyEngine.length === 0 && onlyReference.length === 0;

  const out = {
    pieces: pieces.length,
    auditMs: r3(auditMs.wall),
    referenceMs: r3(referenceMs),
    ratio: r3(referenceMs / auditMs.wall),
    agree,
    auditCpuMs: r3(auditMs.cpu),
    coldAuditMs: r3(cold.wall),
    coldAuditCpuMs: r3(cold.cpu),
    referenceCpuMs: r3(referenceCpuMs),
    cpuRatio: r3(referenceCpuMs / auditMs.cpu),
    auditWithNestingMs: r3(auditWithNestingMs.wall),
    auditWithNestingCpuMs: r3(auditWithNestingMs.cpu),
    auditWithoutFabricationMs: r3(auditWithoutFabricationMs.wall),
    auditWithoutFabricationCpuMs: r3(auditWithoutFabricationMs.cpu),
    reauditOneMotifMs: r3(reauditOneMotifMs.wall),
    reauditOneMotifCpuMs: r3(reauditOneMotifMs.cpu),
    reauditPieces: smallPieces,
    piecesBuildMs: r3(piecesBuildMs.wall),
    piecesBuildCpuMs: r3(piecesBuildMs.cpu),
    loadAverage: r3(os.loadavg()[0]),
    joints: report.summary.joints,
    byKind: report.summary.byKind,
    nonOrthogonal: report.summary.nonOrthogonal,
    components: report.components,
    findings: Object.fromEntries([...new Set(report.findings.map((f) => f.code))].map((c) => [c, report.findings.filter((f) => f.code === c).length])),
    touchingPairs: engine.size,
    referencePairsTested: ref.tested,
    onlyEngine: onlyEngine.slice(0, 10),
    onlyReference: onlyReference.slice(0, 10),
  };
  if (json) process.stdout.write(`${JSON.stringify(out)}\n`);
  else console.table(out);
}

// Runs when started as the script (`npm run bench`), not when another bench imports the generator.
if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  mainBench().catch((e) => {
    process.stderr.write(`benchmark failed: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  });
}

// Benchmark of the 3-D viewer and the first page load
// (`npx tsx --tsconfig tsconfig.server.json tests/bench/viewer.bench.ts [--json]`; needs a built
// client: `npx vite build`, and Debian's Chromium).
//
// What it measures, in one run:
// - Orbiting in headless Chromium (software WebGL) on a revision of 1,200 pieces and one of 180
//   (the engine benchmark's lattice generator, uploaded through the API as a participant does):
//   while the left button drags the model round, every frame the viewer draws is timed in the
//   page — the interval between drawn frames (`frameMs`, the animation-frame clock) and the main
//   thread's share up to the end of the draw call (`renderMs`). Medians and 95th percentiles over
//   the frames drawn, and the ratio 1200 / 180. Draw calls come from the viewer's own
//   `data-draw-calls` (renderer.info.render.calls after each frame); target: at most templates + 20.
// - A click on a piece: from the pointer-down event to the viewer's answer appearing (the pin
//   form or pin marker when the viewer offers one to the signed-in person, else the selected-piece
//   panel), as milliseconds and as frames of that model; target: within one frame. And in Node
//   the work a click costs without the browser: three's raycaster on the instanced slabs plus
//   `anchorAt` (`clickMs`).
// - The software thumbnail of each design (`thumbnailMs`, shared/engine/thumbnail.ts); target:
//   1,200 pieces under about 200 ms.
// - First page JavaScript: the scripts the sign-in page and the dashboard load, gzipped (level 9,
//   node:zlib), from dist/client — found twice: statically (index.html's entry, its imports, and
//   the route chunks' imports) and as the browser actually fetched them; target under 250 KB, and
//   the viewer chunk (the one holding the WebGL renderer) not among them.
// Timings are wall-clock on a loaded 2-core machine; `loadAverage` is the 1-minute load.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import os from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { Jimp } from 'jimp';
import type { Locator, Page, Response } from 'playwright-core';
import { BufferAttribute, BufferGeometry, InstancedMesh, Matrix4, MeshBasicMaterial, PerspectiveCamera, Raycaster, Scene as ThreeScene, Vector2, Vector3 } from 'three';
import { parseDesign } from '../../shared/engine/design.js';
import type { Piece, ResolvedDesign } from '../../shared/engine/model.js';
import { buildPieces } from '../../shared/engine/pieces.js';
import { anchorAt } from '../../shared/engine/pins.js';
import { type Scene, buildScene } from '../../shared/engine/scene.js';
import { PAPER, rgbOf } from '../../shared/engine/palette.js';
import { renderThumbnail } from '../../shared/engine/thumbnail.js';
import { openBrowser, startApp } from '../browser/support/app.js';
import { signIn, signOut } from '../browser/support/pages.js';
import { benchDocument } from './engine.bench.js';

const json = process.argv.includes('--json');
const log = (...args: unknown[]): void => {
  if (!json) console.log(...args);
};
const root = fileURLToPath(new URL('../../', import.meta.url));
const clientDir = join(root, 'dist', 'client');

/** Frames timed per model while orbiting. */
const FRAMES = 60;
const FIRST_PAGE_BUDGET_KB = 250;
const DRAW_CALL_SLACK = 20;

const r2 = (x: number): number => Math.round(x * 100) / 100;

function quantile(xs: readonly number[], q: number): number {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const i = Math.min(s.length - 1, Math.max(0, Math.round(q * (s.length - 1))));
  return s[i];
}
const median = (xs: readonly number[]) => quantile(xs, 0.5);

// ---------------------------------------------------------------------------------------------
// The designs.

interface BenchDesign {
  label: string;
  doc: Record<string, unknown>;
  design: ResolvedDesign;
  pieces: readonly Piece[];
  scene: Scene;
}

function benchDesign(label: string, doc: Record<string, unknown>, expected: number): BenchDesign {
  const parsed = parseDesign(doc);
  if (!parsed.ok) throw new Error(`${label}: design invalid: ${JSON.stringify(parsed.errors.slice(0, 3))}`);
  const build = buildPieces(parsed.design);
  if (build.pieces.length !== expected) throw new Error(`${label}: expected ${expected} pieces, got ${build.pieces.length}`);
  return { label, doc, design: parsed.design, pieces: build.pieces, scene: buildScene(parsed.design, build) };
}

function designs(): BenchDesign[] {
  const big = benchDocument(10, 20261201);
  // As the engine benchmark's re-audit: 3 motifs of the small lattice (2 on 2-fold planes, 1 on 5-fold).
  const small = benchDocument(2, 7);
  small.motifs = small.motifs.slice(0, 3);
  return [benchDesign('1200', { ...big, title: 'Viewer bench, 1,200 pieces' }, 1200), benchDesign('180', { ...small, title: 'Viewer bench, 180 pieces' }, 180)];
}

// ---------------------------------------------------------------------------------------------
// Node: a click's raycast + anchorAt, and the thumbnail.

/** Median ms of three's raycast over the instanced slabs plus anchorAt, per click, over `clicks` rays (and the share that hit). */
function clickCost(d: BenchDesign, clicks: number): { ms: number; hitShare: number } {
  const three = new ThreeScene();
  const material = new MeshBasicMaterial();
  const owners: string[][] = [];
  const meshes: InstancedMesh[] = [];
  for (const mesh of d.scene.meshes) {
    const g = new BufferGeometry();
    g.setAttribute('position', new BufferAttribute(mesh.geometry.positions, 3));
    g.setIndex(new BufferAttribute(mesh.geometry.indices, 1));
    const im = new InstancedMesh(g, material, mesh.instances.length);
    mesh.instances.forEach((inst, k) => im.setMatrixAt(k, new Matrix4().fromArray(Array.from(inst.matrix))));
    im.computeBoundingSphere();
    im.userData.index = meshes.length;
    owners.push(mesh.instances.map((i) => i.piece));
    meshes.push(im);
    three.add(im);
  }
  three.updateMatrixWorld(true);
  // The viewer's opening camera (model-viewer.tsx CameraRig): fov 35, along (0.62, −0.78, 0.48), z up.
  const camera = new PerspectiveCamera(35, 900 / 448, 0.1, 1e6);
  const sin = Math.sin((35 * Math.PI) / 360);
  const dist = (d.scene.radius / sin) * 1.08;
  const dir = new Vector3(0.62, -0.78, 0.48).normalize();
  const target = new Vector3(...d.scene.center);
  camera.up.set(0, 0, 1);
  camera.position.copy(target).addScaledVector(dir, dist);
  camera.lookAt(target);
  camera.updateMatrixWorld(true);
  const byId = new Map(d.pieces.map((p) => [p.id, p]));
  const raycaster = new Raycaster();
  let seed = 12345;
  const next = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 1.2 - 0.6;
  const times: number[] = [];
  let hits = 0;
  for (let i = 0; i < clicks + 5; i++) {
    const ndc = new Vector2(next(), next());
    const t0 = performance.now();
    raycaster.setFromCamera(ndc, camera);
    const hit = raycaster.intersectObjects(meshes, false)[0];
    if (hit && hit.instanceId !== undefined) {
      const piece = byId.get(owners[(hit.object as InstancedMesh).userData.index as number][hit.instanceId]);
      if (piece) {
        anchorAt(piece, [hit.point.x, hit.point.y, hit.point.z]);
        if (i >= 5) hits++;
      }
    }
    if (i >= 5) times.push(performance.now() - t0);
  }
  for (const m of meshes) m.geometry.dispose();
  material.dispose();
  return { ms: median(times), hitShare: hits / clicks };
}

function thumbnailCost(d: BenchDesign): number {
  for (let i = 0; i < 3; i++) renderThumbnail(d.scene);
  const times: number[] = [];
  for (let i = 0; i < 9; i++) {
    const t0 = performance.now();
    renderThumbnail(d.scene);
    times.push(performance.now() - t0);
  }
  return median(times);
}

// ---------------------------------------------------------------------------------------------
// First page JavaScript, from dist/client.

const gzipKb = (file: string): number => gzipSync(readFileSync(join(clientDir, file)), { level: 9 }).length / 1024;

/** `assets/x.js` names a chunk statically imports (`import … from "./y.js"`, `import "./y.js"`), not dynamic `import(…)`. */
function staticImports(file: string): string[] {
  const code = readFileSync(join(clientDir, file), 'utf8');
  const out = new Set<string>();
  for (const m of code.matchAll(/(?:\bfrom|\bimport)\s*["'`](\.\/[^"'`]+\.js)["'`]/g)) out.add(`assets/${m[1].slice(2)}`);
  return [...out];
}

function closure(start: readonly string[]): Set<string> {
  const seen = new Set<string>();
  const todo = [...start];
  while (todo.length) {
    const f = todo.pop()!;
    if (seen.has(f)) continue;
    seen.add(f);
    todo.push(...staticImports(f));
  }
  return seen;
}

/** The chunk of a route module, by the name Vite gives it (`routes/sign-in.tsx` → `assets/sign-in-<hash>.js`). */
function routeChunk(assets: readonly string[], name: string): string {
  const found = assets.filter((f) => new RegExp(`^assets/${name}-[A-Za-z0-9_-]{8}\\.js$`).test(f));
  if (found.length !== 1) throw new Error(`expected one chunk for route ${name}, found ${found.join(', ') || 'none'}`);
  return found[0];
}

interface StaticBundle {
  entry: string;
  viewerChunks: string[];
  signIn: string[];
  dashboard: string[];
  /** Gzipped size (KB) of every script in dist/client/assets, read at once (another build may replace them later). */
  kb: Map<string, number>;
}

function staticBundle(): StaticBundle {
  const html = readFileSync(join(clientDir, 'index.html'), 'utf8');
  const entries = [...html.matchAll(/<script[^>]*type="module"[^>]*src="\/([^"]+)"/g)].map((m) => m[1]);
  const preloads = [...html.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="\/([^"]+)"/g)].map((m) => m[1]);
  if (entries.length !== 1) throw new Error(`dist/client/index.html should load one module script, found ${entries.length}`);
  const assets = readdirSync(join(clientDir, 'assets')).filter((f) => f.endsWith('.js')).map((f) => `assets/${f}`);
  const viewerChunks = assets.filter((f) => /WebGLRenderer|WebGL2RenderingContext/.test(readFileSync(join(clientDir, f), 'utf8')));
  const shell = [...entries, ...preloads];
  return {
    kb: new Map(assets.map((f) => [f, gzipKb(f)])),
    entry: entries[0],
    viewerChunks,
    signIn: [...closure([...shell, routeChunk(assets, 'sign-in')])].sort(),
    dashboard: [...closure([...shell, routeChunk(assets, 'dashboard')])].sort(),
  };
}

// ---------------------------------------------------------------------------------------------
// In the browser.

/** A JSON answer of the API fetched inside the page with its session (method, body optional). */
async function api<T>(page: Page, url: string, method = 'GET', body?: unknown): Promise<T> {
  const src = `(async () => {
    const r = await fetch(${JSON.stringify(url)}, { method: ${JSON.stringify(method)}, headers: { 'Content-Type': 'application/json' }, body: ${body === undefined ? 'undefined' : JSON.stringify(JSON.stringify(body))} });
    const text = await r.text();
    if (!r.ok) throw new Error(${JSON.stringify(`${method} ${url}`)} + ': ' + r.status + ' ' + text.slice(0, 300));
    return JSON.parse(text);
  })()`;
  return (await page.evaluate(src)) as T;
}

/** Uploads a revision and waits for its audit; its id and the number of joints the audit found (markers the viewer draws). */
async function uploadRevision(page: Page, briefId: number, doc: Record<string, unknown>): Promise<{ id: number; joints: number }> {
  const rev = await api<{ id: number }>(page, `/api/briefs/${briefId}/revisions`, 'POST', { design: doc });
  const deadline = Date.now() + 120_000;
  for (;;) {
    const audit = await api<{ state: string; error: string | null; report: { joints: unknown[] } | null }>(page, `/api/revisions/${rev.id}/audit`);
    if (audit.state === 'done') return { id: rev.id, joints: audit.report?.joints.length ?? 0 };
    if (audit.state === 'failed') throw new Error(`audit of revision ${rev.id} failed: ${audit.error}`);
    if (Date.now() > deadline) throw new Error(`audit of revision ${rev.id} still ${audit.state} after 120 s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** Records every frame the viewer draws: the frame's clock and the main thread's time at the end of the draw. */
const FRAME_RECORDER = `(() => {
  const el = document.querySelector('[data-testid="model-viewer"]');
  const frames = [];
  const mo = new MutationObserver(() => frames.push({ frame: document.timeline.currentTime, done: performance.now(), calls: Number(el.getAttribute('data-draw-calls')) }));
  mo.observe(el, { attributes: true, attributeFilter: ['data-draw-calls'] });
  window.__viewerBench = { frames, stop: () => mo.disconnect() };
})()`;

interface FrameSample {
  frame: number;
  done: number;
  calls: number;
}

interface OrbitResult {
  frames: number;
  frameMs: number;
  frameP95Ms: number;
  renderMs: number;
  renderP95Ms: number;
  drawCalls: number;
  templates: number;
  pieces: number;
}

async function orbit(page: Page, frameCount = FRAMES): Promise<OrbitResult> {
  const viewer = page.getByTestId('model-viewer');
  const canvas = viewer.locator('canvas');
  await viewer.scrollIntoViewIfNeeded();
  const box = (await canvas.boundingBox())!;
  await page.evaluate(FRAME_RECORDER);
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  const radius = Math.min(box.width, box.height) * 0.3;
  await page.mouse.move(cx + radius, cy);
  await page.mouse.down();
  const t0 = Date.now();
  let k = 0;
  // Round and round (a quarter turn of the mouse every 40 moves), until enough frames are drawn.
  while (Date.now() - t0 < 90_000) {
    k++;
    const a = (k / 40) * (Math.PI / 2);
    await page.mouse.move(cx + radius * Math.cos(a), cy + radius * Math.sin(a) * 0.6);
    if (k % 10 === 0 && ((await page.evaluate('window.__viewerBench.frames.length')) as number) >= frameCount + 6) break;
  }
  await page.mouse.up();
  const frames = (await page.evaluate('(() => { window.__viewerBench.stop(); return window.__viewerBench.frames; })()')) as FrameSample[];
  // Leave out the first frames (the drag starting) and keep FRAMES.
  const kept = frames.slice(5, 5 + frameCount + 1);
  const intervals = kept.slice(1).map((f, i) => f.frame - kept[i].frame);
  const renders = kept.map((f) => f.done - f.frame);
  return {
    frames: intervals.length,
    frameMs: r2(median(intervals)),
    frameP95Ms: r2(quantile(intervals, 0.95)),
    renderMs: r2(median(renders)),
    renderP95Ms: r2(quantile(renders, 0.95)),
    drawCalls: Math.max(...kept.map((f) => f.calls)),
    templates: Number(await viewer.getAttribute('data-templates')),
    pieces: Number(await viewer.getAttribute('data-pieces')),
  };
}

/** The viewer once it has drawn its first frames, scrolled into view. */
async function drawnViewer(page: Page): Promise<Locator> {
  const viewer = page.getByTestId('model-viewer');
  await viewer.waitFor({ timeout: 60_000 });
  for (let i = 0; i < 600 && (await viewer.getAttribute('data-draw-calls')) === null; i++) await page.waitForTimeout(100);
  await viewer.scrollIntoViewIfNeeded();
  await page.waitForTimeout(500);
  return viewer;
}

/**
 * What a click on a piece makes appear, in order: the new-pin form (a critic placing a pin), a
 * new pin marker, else the side panel naming the piece as selected.
 */
const CLICK_ANSWERS = `[
  ['new-pin form', () => Boolean(document.querySelector('[data-testid="new-pin-form"]'))],
  ['pin marker', () => document.querySelectorAll('[data-pin-marker]').length > (window.__markersBefore ?? 0)],
  ['selected-piece panel', () => (document.querySelector('[data-testid="piece-panel"]')?.textContent ?? '').includes('Selected piece')],
]`;

interface ClickResult {
  ms: number;
  frames: number;
  answer: string;
  /** The viewer was in pin-placing mode when clicked (P pressed first). */
  placing: boolean;
}

/** A point of the canvas (page coordinates) where the model is drawn solidly, nearest the centre. */
async function pointOnModel(page: Page): Promise<{ x: number; y: number }> {
  const canvas = page.getByTestId('model-viewer').locator('canvas');
  await canvas.scrollIntoViewIfNeeded();
  const box = (await canvas.boundingBox())!;
  const img = await Jimp.read(await canvas.screenshot());
  const { width, height, data } = img.bitmap;
  const paper = rgbOf(PAPER);
  const solid = (x: number, y: number) => {
    for (let dy = -3; dy <= 3; dy++) {
      for (let dx = -3; dx <= 3; dx++) {
        const i = 4 * ((y + dy) * width + (x + dx));
        if (Math.abs(data[i] - paper[0]) + Math.abs(data[i + 1] - paper[1]) + Math.abs(data[i + 2] - paper[2]) <= 24) return false;
      }
    }
    return true;
  };
  const cx = Math.floor(width / 2);
  const cy = Math.floor(height / 2);
  for (let r = 0; r < Math.min(width, height) / 2 - 4; r += 2) {
    for (let k = 0; k < Math.max(1, 4 * r); k++) {
      const a = (k / Math.max(1, 4 * r)) * 2 * Math.PI;
      const x = Math.round(cx + r * Math.cos(a));
      const y = Math.round(cy + r * Math.sin(a));
      if (x > 3 && y > 3 && x < width - 4 && y < height - 4 && solid(x, y)) return { x: box.x + (x * box.width) / width, y: box.y + (y * box.height) / height };
    }
  }
  throw new Error('no point of the model found on the canvas');
}

/** From pointer-down on the canvas to the first of {@link CLICK_ANSWERS} turning true, in the page's clock (and in drawn frames). */
async function clickLatency(page: Page): Promise<ClickResult | null> {
  // A fresh page: nothing selected, nothing being placed.
  await page.reload();
  const viewer = await drawnViewer(page);
  // A critic places a pin: the "Place a pin" button (once the pins have loaded), then a click on a piece.
  const place = page.getByRole('button', { name: /^Place a pin/ });
  await place.waitFor({ timeout: 15_000 }).catch(() => undefined);
  if (await place.count()) await place.click();
  let placing = false;
  for (let i = 0; i < 30 && !placing; i++) {
    placing = (await viewer.getAttribute('data-placing')) === 'true';
    if (!placing) await page.waitForTimeout(100);
  }
  await page.mouse.move(1, 1);
  await page.waitForTimeout(300);
  const at = await pointOnModel(page);
  await page.evaluate(`(() => {
    window.__markersBefore = document.querySelectorAll('[data-pin-marker]').length;
    const answers = ${CLICK_ANSWERS}.filter(([, test]) => !test());
    const el = document.querySelector('[data-testid="model-viewer"]');
    const state = { down: null, seen: null, answer: null, frames: 0 };
    window.__clickBench = state;
    el.addEventListener('pointerdown', (e) => { state.down = e.timeStamp; }, { capture: true, once: true });
    const look = () => {
      if (state.down === null || state.seen !== null) return;
      const hit = answers.find(([, test]) => test());
      if (hit) { state.seen = performance.now(); state.answer = hit[0]; }
    };
    new MutationObserver(look).observe(document.body, { subtree: true, childList: true, attributes: true, characterData: true });
    new MutationObserver(() => { if (state.down !== null && state.seen === null) state.frames++; }).observe(el, { attributes: true, attributeFilter: ['data-draw-calls'] });
  })()`);
  await page.mouse.click(at.x, at.y);
  const deadline = Date.now() + 10_000;
  for (;;) {
    const s = (await page.evaluate('window.__clickBench')) as { down: number | null; seen: number | null; answer: string | null; frames: number };
    if (s.seen !== null && s.down !== null) {
      // Leave the form unsaved: Escape closes it (and any placing).
      await page.keyboard.press('Escape');
      return { ms: r2(s.seen - s.down), frames: s.frames, answer: s.answer!, placing };
    }
    if (Date.now() > deadline) {
      log(`click at ${at.x.toFixed(0)}, ${at.y.toFixed(0)}: no answer within 10 s (pointer-down ${s.down === null ? 'not seen' : 'seen'}, placing ${placing})`);
      await page.keyboard.press('Escape');
      return null;
    }
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** Scripts the page fetched while `act` ran: path under dist/client → gzipped size (KB) of the bytes received. */
async function scriptsFetched(page: Page, act: () => Promise<void>): Promise<Map<string, number>> {
  const pending: Promise<void>[] = [];
  const seen = new Map<string, number>();
  const on = (r: Response) => {
    const path = new URL(r.url()).pathname.replace(/^\//, '');
    if (r.request().resourceType() !== 'script' && !path.endsWith('.js')) return;
    pending.push(
      r.body().then(
        (b) => void seen.set(path, gzipSync(b, { level: 9 }).length / 1024),
        () => undefined,
      ),
    );
  };
  page.on('response', on);
  try {
    await act();
    await page.waitForLoadState('networkidle');
    await Promise.all(pending);
  } finally {
    page.off('response', on);
  }
  return seen;
}

interface ModelFigures extends OrbitResult {
  revisionId: number;
  joints: number;
  click: ClickResult | null;
  /** Frame interval with the joint overlay hidden ("Show joints" off), to tell the slabs' cost from the markers'. */
  frameMsWithoutJoints: number;
}

async function inBrowser(all: BenchDesign[]): Promise<{ models: Record<string, ModelFigures>; signInFetched: Map<string, number>; dashboardFetched: Map<string, number> }> {
  const app = await startApp();
  let browser: Awaited<ReturnType<typeof openBrowser>> | null = null;
  try {
    browser = await openBrowser();
    const page = await browser.context.newPage();
    page.on('pageerror', (e) => log(`page error: ${e.message}`));
    // First page: a fresh browser opening the sign-in page, then the dashboard after signing in.
    const signInFetched = await scriptsFetched(page, async () => {
      await page.goto(`${app.url}/sign-in`);
      await page.getByLabel('E-mail').waitFor();
    });
    const dashboardFetched = await scriptsFetched(page, () => signIn(page, app.url, 'participant@example.org'));

    // Each model is the latest revision of a submission the demo critic is assigned to (pins go
    // on a submission's latest revision): the 180 pieces from participant@ on the icosahedral
    // brief, the 1,200 from lars.brennholt@ on the octahedral one (the brief's rules only add findings).
    const uploaders: Record<string, { email: string; brief: RegExp }> = {
      '180': { email: 'participant@example.org', brief: /icosahedral/i },
      '1200': { email: 'lars.brennholt@example.org', brief: /octahedral/i },
    };
    const revisions = new Map<string, { id: number; joints: number }>();
    for (const d of all) {
      const who = uploaders[d.label];
      if (!page.url().startsWith(app.url) || (await api<{ email: string }>(page, '/api/auth/me').catch(() => null))?.email !== who.email) {
        if (await page.getByRole('button', { name: /sign out/i }).count()) await signOut(page);
        await signIn(page, app.url, who.email);
      }
      const briefs = await api<{ id: number; title: string }[]>(page, '/api/studios/1/briefs');
      const brief = briefs.find((b) => who.brief.test(b.title));
      if (!brief) throw new Error(`no brief matching ${who.brief} in the demo (briefs: ${briefs.map((b) => b.title).join(', ')})`);
      revisions.set(d.label, await uploadRevision(page, brief.id, d.doc));
      log(`revision ${revisions.get(d.label)!.id}: ${d.label} pieces by ${who.email}, audited (${revisions.get(d.label)!.joints} joints)`);
    }
    // The critic assigned to both submissions opens the revisions and places pins.
    await signOut(page);
    await signIn(page, app.url, 'critic@example.org');
    const models: Record<string, ModelFigures> = {};
    for (const d of all) {
      const { id: revisionId, joints } = revisions.get(d.label)!;
      await page.goto(`${app.url}/revisions/${revisionId}`);
      await drawnViewer(page);
      const t0 = Date.now();
      const o = await orbit(page);
      log(`${d.label} pieces: ${o.frames} frames timed while orbiting in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
      await page.getByLabel('Show joints').uncheck();
      await page.waitForTimeout(500);
      const bare = await orbit(page, 20);
      await page.getByLabel('Show joints').check();
      const click = await clickLatency(page);
      models[d.label] = { revisionId, joints, ...o, click, frameMsWithoutJoints: bare.frameMs };
    }
    return { models, signInFetched, dashboardFetched };
  } finally {
    await browser?.close();
    await app.stop();
  }
}

// ---------------------------------------------------------------------------------------------

async function main(): Promise<void> {
  if (!existsSync(join(clientDir, 'index.html'))) throw new Error('dist/client is missing: run `npx vite build` first');
  const all = designs();
  const bundle = staticBundle();
  const node = Object.fromEntries(all.map((d) => [d.label, { click: clickCost(d, 200), thumbnailMs: r2(thumbnailCost(d)) }]));
  const browser = await inBrowser(all);
  const kb = (files: readonly string[]) => r2(files.reduce((s, f) => s + (bundle.kb.get(f) ?? NaN), 0));
  const fetchedKb = (m: Map<string, number>) => r2([...m.values()].reduce((s, v) => s + v, 0));
  const signInFetched = [...browser.signInFetched.keys()].sort();
  const dashboardFetched = [...browser.dashboardFetched.keys()].sort();
  const big = browser.models['1200'];
  const small = browser.models['180'];
  const firstPage = {
    signInStaticKb: kb(bundle.signIn),
    dashboardStaticKb: kb(bundle.dashboard),
    signInFetchedKb: fetchedKb(browser.signInFetched),
    // The dashboard after signing in has every script of the sign-in page too (one page load).
    dashboardFetchedKb: fetchedKb(new Map([...browser.signInFetched, ...browser.dashboardFetched])),
  };
  const viewerInFirstPage = [...bundle.signIn, ...bundle.dashboard, ...signInFetched, ...dashboardFetched].filter((f) => bundle.viewerChunks.includes(f));
  const checks = {
    drawCalls1200: big.frames > 0 && big.drawCalls > 0 && big.drawCalls <= big.templates + DRAW_CALL_SLACK,
    drawCalls180: small.frames > 0 && small.drawCalls > 0 && small.drawCalls <= small.templates + DRAW_CALL_SLACK,
    clickWithinOneFrame1200: big.click !== null && big.click.ms <= big.frameMs,
    clickWithinOneFrame180: small.click !== null && small.click.ms <= small.frameMs,
    thumbnail1200Under200Ms: node['1200'].thumbnailMs < 200,
    firstPageUnder250Kb: Math.max(...Object.values(firstPage)) < FIRST_PAGE_BUDGET_KB,
    viewerChunkNotInFirstPage: bundle.viewerChunks.length > 0 && viewerInFirstPage.length === 0,
  };
  const out = {
    pieces1200: big.pieces,
    templates1200: big.templates,
    joints1200: big.joints,
    drawCalls1200: big.drawCalls,
    frameMs1200: big.frameMs,
    frameP95Ms1200: big.frameP95Ms,
    renderMs1200: big.renderMs,
    renderP95Ms1200: big.renderP95Ms,
    pieces180: small.pieces,
    templates180: small.templates,
    joints180: small.joints,
    drawCalls180: small.drawCalls,
    frameMs180: small.frameMs,
    frameP95Ms180: small.frameP95Ms,
    renderMs180: small.renderMs,
    renderP95Ms180: small.renderP95Ms,
    frameRatio: r2(big.frameMs / small.frameMs),
    frameMsWithoutJoints1200: big.frameMsWithoutJoints,
    frameMsWithoutJoints180: small.frameMsWithoutJoints,
    renderRatio: r2(big.renderMs / small.renderMs),
    framesTimed: Math.min(big.frames, small.frames),
    clickToAnswerMs1200: big.click?.ms ?? null,
    clickFrames1200: big.click?.frames ?? null,
    clickToAnswerMs180: small.click?.ms ?? null,
    clickFrames180: small.click?.frames ?? null,
    clickAnswer1200: big.click ? `${big.click.answer}${big.click.placing ? ' (placing a pin)' : ''}` : null,
    clickAnswer180: small.click ? `${small.click.answer}${small.click.placing ? ' (placing a pin)' : ''}` : null,
    raycastAnchorMs1200: r2(node['1200'].click.ms),
    raycastAnchorMs180: r2(node['180'].click.ms),
    raycastHitShare1200: r2(node['1200'].click.hitShare),
    thumbnailMs1200: node['1200'].thumbnailMs,
    thumbnailMs180: node['180'].thumbnailMs,
    ...firstPage,
    firstPageScripts: new Set([...signInFetched, ...dashboardFetched]).size,
    viewerChunks: bundle.viewerChunks.join(' '),
    viewerChunkKb: kb(bundle.viewerChunks),
    loadAverage: r2(os.loadavg()[0]),
    checks,
  };
  if (json) {
    process.stdout.write(`${JSON.stringify({ ...out, signInScripts: bundle.signIn, dashboardScripts: bundle.dashboard, signInFetched, dashboardFetched })}\n`);
  } else {
    const { checks: c, ...figures } = out;
    console.table(figures);
    console.table(c);
  }
  if (Object.values(checks).some((ok) => !ok)) process.exitCode = 1;
}

main().catch((e) => {
  process.stderr.write(`viewer benchmark failed: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exitCode = 1;
});

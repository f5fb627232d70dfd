/**
 * The 3-D viewer on a revision page: a participant opens their latest seeded revision (the demo's
 * keel lantern), the canvas draws the model (a screenshot of it is not just background), a
 * click in the middle of the model names a piece in the side panel, and the exploded view and the
 * cutting plane each change the drawing. On a revision that falls apart (the demo's half keels),
 * the "Show on model" button of the `disconnected` finding highlights its pieces and the colouring
 * by connected group lists the groups. Without WebGL the section says so in a sentence.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { Jimp } from 'jimp';
import type { Page } from 'playwright-core';
import { expect, it } from 'vitest';
import { useAppAndBrowser, watchPage } from './support/app.js';
import { expectAccessible, signIn } from './support/pages.js';

const session = useAppAndBrowser();

/** A JSON answer of the API, fetched from inside the page with the page's own session. */
async function getJson<T>(page: Page, url: string): Promise<T> {
  return (await page.evaluate(async (u) => {
    const r = await fetch(u);
    if (!r.ok) throw new Error(`${u}: ${r.status}`);
    return (await r.json()) as unknown;
  }, url)) as T;
}

/** The signed-in participant's revisions, one list per submission, in studio and brief order. */
async function myRevisions(page: Page): Promise<{ id: number; number: number }[][]> {
  const out: { id: number; number: number }[][] = [];
  for (const s of await getJson<{ id: number }[]>(page, '/api/studios')) {
    for (const b of await getJson<{ mySubmission: { id: number } | null }[]>(page, `/api/studios/${s.id}/briefs`)) {
      if (!b.mySubmission) continue;
      out.push((await getJson<{ revisions: { id: number; number: number }[] }>(page, `/api/submissions/${b.mySubmission.id}`)).revisions);
    }
  }
  return out;
}

/** The participant's latest revision of their first submission, found through the API (as the app does). */
async function latestRevision(page: Page): Promise<number | null> {
  for (const revisions of await myRevisions(page)) {
    const latest = [...revisions].sort((x, y) => y.number - x.number)[0];
    if (latest) return latest.id;
  }
  return null;
}

/** Paper background of the viewer (src/features/viewer/palette.ts). */
const PAPER = [0xf4, 0xef, 0xe4];

it('a participant sees the model of their revision and a click names a piece', { timeout: 120_000 }, async () => {
  const page = await session.browser.context.newPage();
  const { problems } = watchPage(page);
  await signIn(page, session.app.url, 'participant@example.org');

  // Find the participant's latest revision through the API, as the page itself would.
  const revisionId = await latestRevision(page);
  expect(revisionId, 'the participant has a seeded revision').not.toBeNull();


  await page.goto(`${session.app.url}/revisions/${revisionId}`);
  const viewer = page.getByTestId('model-viewer');
  await viewer.waitFor({ timeout: 30_000 });
  const canvas = viewer.locator('canvas');
  await canvas.waitFor({ timeout: 30_000 });
  // Let the demand frame loop draw (the probe writes the draw calls after each frame).
  await expect.poll(() => viewer.getAttribute('data-draw-calls'), { timeout: 30_000 }).not.toBeNull();
  await page.waitForTimeout(300);

  const shot = await canvas.screenshot();
  const dir = join(session.app.dir, '..', 'planewright-viewer-shots');
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'viewer.png'), shot);
  const img = await Jimp.read(shot);
  const { width, height, data } = img.bitmap;
  let differing = 0;
  for (let i = 0; i < width * height; i++) {
    const d = Math.abs(data[4 * i] - PAPER[0]) + Math.abs(data[4 * i + 1] - PAPER[1]) + Math.abs(data[4 * i + 2] - PAPER[2]);
    if (d > 24) differing++;
  }
  const share = differing / (width * height);
  expect(share, `share of pixels that are not background: ${share}`).toBeGreaterThan(0.02);

  const templates = Number(await viewer.getAttribute('data-templates'));
  const calls = Number(await viewer.getAttribute('data-draw-calls'));
  console.log(`viewer: ${await viewer.getAttribute('data-pieces')} pieces, ${templates} templates, ${calls} draw calls, ${(share * 100).toFixed(1)} % drawn`);
  // One call per template plus the joint overlay (lines, at most 5 marker kinds, problem rings).
  expect(calls).toBeGreaterThan(0);
  expect(calls).toBeLessThanOrEqual(templates + 7);

  const box = await canvas.boundingBox();
  expect(box).not.toBeNull();
  await page.mouse.click(box!.x + box!.width / 2, box!.y + box!.height / 2);
  const id = page.getByTestId('piece-id');
  await id.waitFor({ timeout: 10_000 });
  const pieceId = (await id.innerText()).trim();
  expect(pieceId).toMatch(/^[A-Za-z0-9_.-]+-\d{2,}$/);
  await expect.poll(() => page.getByTestId('piece-panel').innerText()).toContain('Selected piece');
  const panel = await page.getByTestId('piece-panel').innerText();
  expect(panel).toMatch(/Motif/);
  expect(panel).toMatch(/Template\s+T\d+/);
  expect(panel).toMatch(/Joints \(\d+\)/);

  // The exploded view moves the pieces: the drawing changes.
  await page.getByLabel('Exploded view').fill('1');
  await page.waitForTimeout(300);
  const exploded = await Jimp.read(await canvas.screenshot());
  let changed = 0;
  for (let i = 0; i < width * height; i++) {
    const d = Math.abs(exploded.bitmap.data[4 * i] - data[4 * i]) + Math.abs(exploded.bitmap.data[4 * i + 1] - data[4 * i + 1]) + Math.abs(exploded.bitmap.data[4 * i + 2] - data[4 * i + 2]);
    if (d > 24) changed++;
  }
  expect(changed / (width * height), 'share of pixels the exploded view changed').toBeGreaterThan(0.02);

  // The cutting plane at mid-height takes away the upper half: the drawing changes again.
  await page.getByLabel('Exploded view').fill('0');
  await page.getByLabel('Cut through').check();
  await page.waitForTimeout(300);
  const cut = await Jimp.read(await canvas.screenshot());
  let cutChanged = 0;
  for (let i = 0; i < width * height; i++) {
    const d = Math.abs(cut.bitmap.data[4 * i] - data[4 * i]) + Math.abs(cut.bitmap.data[4 * i + 1] - data[4 * i + 1]) + Math.abs(cut.bitmap.data[4 * i + 2] - data[4 * i + 2]);
    if (d > 24) cutChanged++;
  }
  expect(cutChanged / (width * height), 'share of pixels the cutting plane changed').toBeGreaterThan(0.02);
  await page.screenshot({ path: join(dir, 'page.png'), fullPage: false });
  expect(problems).toEqual([]);
});

interface SeededReport {
  components: number;
  findings: { code: string; pieces: string[] }[];
  groups: string[][];
}

/** The participant's first seeded revision whose audit found more than one connected group. */
async function looseRevision(page: Page): Promise<{ id: number; report: SeededReport } | null> {
  for (const revisions of await myRevisions(page)) {
    for (const r of revisions) {
      const report = (await getJson<{ audit: { report: SeededReport | null } }>(page, `/api/revisions/${r.id}`)).audit.report;
      if (report && report.components > 1) return { id: r.id, report };
    }
  }
  return null;
}

/** Share of pixels that differ (summed channel difference over 24) between two screenshots. */
function changedShare(a: Awaited<ReturnType<typeof Jimp.read>>, b: Awaited<ReturnType<typeof Jimp.read>>): number {
  const { width, height } = a.bitmap;
  expect([b.bitmap.width, b.bitmap.height]).toEqual([width, height]);
  let changed = 0;
  for (let i = 0; i < width * height; i++) {
    const d = Math.abs(a.bitmap.data[4 * i] - b.bitmap.data[4 * i]) + Math.abs(a.bitmap.data[4 * i + 1] - b.bitmap.data[4 * i + 1]) + Math.abs(a.bitmap.data[4 * i + 2] - b.bitmap.data[4 * i + 2]);
    if (d > 24) changed++;
  }
  return changed / (width * height);
}

it('on a revision that falls apart, a finding is shown on the model and the loose groups are coloured', { timeout: 120_000 }, async () => {
  const page = await session.browser.context.newPage();
  const { problems } = watchPage(page);
  await session.browser.context.clearCookies();
  await signIn(page, session.app.url, 'participant@example.org');
  const loose = await looseRevision(page);
  expect(loose, 'the participant has a seeded revision with loose groups (the half keels)').not.toBeNull();
  const { id, report } = loose!;
  const finding = report.findings.find((f) => f.code === 'disconnected');
  expect(finding, 'the audit reports the design as disconnected').toBeDefined();
  expect(report.groups.length).toBe(report.components);

  await page.goto(`${session.app.url}/revisions/${id}`);
  const viewer = page.getByTestId('model-viewer');
  const canvas = viewer.locator('canvas');
  await canvas.waitFor({ timeout: 30_000 });
  await expect.poll(() => viewer.getAttribute('data-draw-calls'), { timeout: 30_000 }).not.toBeNull();
  expect(await viewer.getAttribute('data-highlighted')).toBe('0');
  await page.waitForTimeout(300);
  const before = await Jimp.read(await canvas.screenshot());

  // The finding's button, reached by its accessible name, and pressed from the keyboard.
  const show = page.getByRole('button', { name: /^Show on model: disconnected,/ });
  await show.focus();
  await page.keyboard.press('Enter');
  const expected = new Set(finding!.pieces).size;
  await expect.poll(() => viewer.getAttribute('data-highlighted'), { timeout: 10_000 }).toBe(String(expected));
  expect(await show.getAttribute('aria-pressed')).toBe('true');
  expect(await page.getByTestId('viewer-focus').innerText()).toContain(`Showing ${expected} pieces of disconnected`);
  // The camera flight lasts 400 ms; then the dimmed, reframed model is drawn.
  await page.waitForTimeout(700);
  const focused = await Jimp.read(await canvas.screenshot());
  const focusShare = changedShare(before, focused);
  console.log(`viewer: disconnected finding shows ${expected} of ${await viewer.getAttribute('data-pieces')} pieces, ${(focusShare * 100).toFixed(1)} % of pixels changed`);
  // The finding names the 76 pieces outside the largest group, so only that group's 4 pieces are
  // dimmed and the framing barely moves: a small share, but thousands of pixels.
  expect(focusShare, 'share of pixels the highlight changed').toBeGreaterThan(0.003);

  // Clear returns to the whole model: the drawing is back to the first one.
  await page.getByRole('button', { name: 'Clear highlight' }).click();
  await expect.poll(() => viewer.getAttribute('data-highlighted')).toBe('0');
  expect(await show.getAttribute('aria-pressed')).toBe('false');
  await page.waitForTimeout(700);
  const cleared = await Jimp.read(await canvas.screenshot());
  expect(changedShare(before, cleared), 'share of pixels still changed after Clear').toBeLessThan(focusShare / 3);

  // Colouring by connected group: the legend names every group with its size.
  await page.getByLabel('Colour by connected group').check();
  const legend = page.getByTestId('group-legend');
  await legend.waitFor({ timeout: 10_000 });
  const sizes = report.groups.map((g) => g.length).sort((a, b) => b - a);
  expect(await legend.innerText()).toContain(`Connected groups (${report.components})`);
  const items = await legend.getByRole('listitem').allInnerTexts();
  expect(items).toEqual(sizes.map((n, i) => `Group ${i + 1}: ${n} ${n === 1 ? 'piece' : 'pieces'}${i === 0 ? ' (largest)' : ''}${i > 8 ? ' (colour repeats)' : ''}`));
  expect(await viewer.getAttribute('data-group-colours')).toBe(String(report.components));
  await page.waitForTimeout(300);
  const grouped = await Jimp.read(await canvas.screenshot());
  expect(changedShare(before, grouped), 'share of pixels the group colours changed').toBeGreaterThan(0.02);

  // A finding can be shown while the groups are coloured; the page stays accessible with the
  // focus bar and the group legend out; pressing the shown finding's button again clears it.
  await show.click();
  await expect.poll(() => viewer.getAttribute('data-highlighted')).toBe(String(expected));
  await expectAccessible(page, 'revision page with a finding shown and groups coloured');
  await show.click();
  await expect.poll(() => viewer.getAttribute('data-highlighted')).toBe('0');
  expect(await page.getByRole('button', { name: 'Clear highlight' }).count()).toBe(0);
  const dir = join(session.app.dir, '..', 'planewright-viewer-shots');
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'viewer-groups.png'), await canvas.screenshot());
  expect(problems).toEqual([]);
});

it('without WebGL the model section says so in a sentence and the rest of the page works', { timeout: 60_000 }, async () => {
  const page = await session.browser.context.newPage();
  const { problems } = watchPage(page);
  // As in a browser with WebGL turned off: no WebGL context can be made.
  await page.addInitScript({
    content: `(() => {
      const original = HTMLCanvasElement.prototype.getContext;
      HTMLCanvasElement.prototype.getContext = function (kind, ...rest) {
        return String(kind).startsWith('webgl') ? null : original.call(this, kind, ...rest);
      };
    })();`,
  });
  await session.browser.context.clearCookies();
  await signIn(page, session.app.url, 'participant@example.org');
  const revisionId = await latestRevision(page);
  expect(revisionId).not.toBeNull();
  await page.goto(`${session.app.url}/revisions/${revisionId}`);
  const model = page.getByRole('region', { name: 'Model' });
  await expect.poll(() => model.getByRole('alert').innerText(), { timeout: 30_000 }).toContain('WebGL');
  expect(await page.getByTestId('model-viewer').count()).toBe(0);
  await page.getByRole('heading', { name: 'Findings' }).waitFor();
  expect(problems).toEqual([]);
});

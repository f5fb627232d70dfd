/**
 * Pins on the 3-D model, end to end in two browsers: the critic turns on place-a-pin mode with
 * the P key, clicks a piece, writes the first comment and saves; the pin is listed and drawn at
 * once. A piece chosen by keyboard (arrow keys) gets the new-pin form with Enter, and Escape drops
 * it. The participant, in a browser of their own, clicks the pin's marker, which selects it in the
 * list and opens its thread (the comment's raw HTML left out), replies and resolves; the critic's
 * page shows the reply and the new state without a reload. axe-core checks both pages.
 */
import type { Page } from 'playwright-core';
import { afterAll, expect, it } from 'vitest';
import { type Browser, openBrowser, useAppAndBrowser, watchPage } from './support/app.js';
import { expectAccessible, signIn } from './support/pages.js';

const session = useAppAndBrowser();
let second: Browser | null = null;
afterAll(async () => {
  await second?.close();
});

async function getJson<T>(page: Page, url: string): Promise<T> {
  return (await page.evaluate(async (u) => {
    const r = await fetch(u);
    if (!r.ok) throw new Error(`${u}: ${r.status}`);
    return (await r.json()) as unknown;
  }, url)) as T;
}

/** The signed-in participant's latest revision of their first submission. */
async function latestRevision(page: Page): Promise<number> {
  for (const s of await getJson<{ id: number }[]>(page, '/api/studios')) {
    for (const b of await getJson<{ mySubmission: { id: number } | null }[]>(page, `/api/studios/${s.id}/briefs`)) {
      if (!b.mySubmission) continue;
      const { revisions } = await getJson<{ revisions: { id: number; number: number }[] }>(page, `/api/submissions/${b.mySubmission.id}`);
      const latest = [...revisions].sort((x, y) => y.number - x.number)[0];
      if (latest) return latest.id;
    }
  }
  throw new Error('the participant has no seeded revision');
}

async function openModel(page: Page, url: string) {
  await page.goto(url);
  const viewer = page.getByTestId('model-viewer');
  await viewer.waitFor({ timeout: 30_000 });
  await expect.poll(() => viewer.getAttribute('data-draw-calls'), { timeout: 30_000 }).not.toBeNull();
  await viewer.scrollIntoViewIfNeeded();
  return viewer;
}

it('a critic pins a piece, the participant answers and resolves, and the critic sees it live', { timeout: 120_000 }, async () => {
  second = await openBrowser();
  const participant = await second.context.newPage();
  const participantProblems = watchPage(participant).problems;
  await signIn(participant, session.app.url, 'participant@example.org');
  const revisionId = await latestRevision(participant);

  const critic = await session.browser.context.newPage();
  const { problems } = watchPage(critic);
  await signIn(critic, session.app.url, 'critic@example.org');
  const viewer = await openModel(critic, `${session.app.url}/revisions/${revisionId}`);
  // The demo may already hold pins on this revision: count them first.
  await critic.getByRole('heading', { name: /^Pins \(\d+\)$/ }).waitFor({ timeout: 15_000 });
  const rows = critic.getByTestId('pin-list').getByRole('button');
  const before = (await critic.getByTestId('pin-list').count()) ? await rows.count() : 0;
  const markersBefore = await critic.locator('[data-pin-marker]').count();

  // P, then a click on the piece in the middle of the model.
  await critic.keyboard.press('p');
  expect(await viewer.getAttribute('data-placing')).toBe('true');
  const box = (await viewer.locator('canvas').boundingBox())!;
  await critic.mouse.click(box.x + box.width / 2, box.y + box.height / 2);
  const form = critic.getByTestId('new-pin-form');
  await form.waitFor({ timeout: 5_000 });
  const piece = (await form.getByRole('heading').innerText()).replace('New pin on ', '').trim();
  expect(piece).toMatch(/^[A-Za-z0-9_.-]+-\d{2,}$/);
  expect(await viewer.getAttribute('data-placing')).toBeNull();
  await form.getByLabel('Category').selectOption('fabrication');
  await form.getByLabel('Comment').fill('The **tab** looks thin for 3 mm birch. <img src=x onerror="window.__pinned=1">');
  await form.getByRole('button', { name: 'Save pin' }).click();
  // Listed and drawn at once (oldest first, so the new pin is last); the server's id follows.
  await expect.poll(() => rows.count(), { timeout: 2_000 }).toBe(before + 1);
  const row = rows.last();
  expect(await row.innerText()).toContain(piece);
  expect(await row.innerText()).toContain('Fabrication');
  await expect.poll(() => critic.locator('[data-pin-marker]').count()).toBe(markersBefore + 1);
  await expect.poll(() => row.innerText(), { timeout: 10_000 }).toContain('0 replies');
  const pinId = await row.getAttribute('data-pin-id');
  expect(Number(pinId)).toBeGreaterThan(0);
  await expect.poll(() => critic.locator(`[data-pin-marker="${pinId}"]`).isVisible()).toBe(true);

  // By keyboard: the model takes the focus, an arrow key chooses a piece, Enter opens the form.
  await viewer.focus();
  await critic.keyboard.press('ArrowRight');
  const label = (await critic.getByTestId('piece-label').innerText()).split(' ')[0];
  await critic.keyboard.press('Enter');
  await expect.poll(() => critic.getByTestId('new-pin-form').getByRole('heading').innerText()).toBe(`New pin on ${label}`);
  await critic.keyboard.press('Escape');
  await expect.poll(() => critic.getByTestId('new-pin-form').count()).toBe(0);
  // The keyboard goes back to the button that starts placing.
  await expect.poll(() => critic.locator(':focus').getAttribute('aria-keyshortcuts')).toBe('P');
  await expectAccessible(critic, 'the revision page with a pin, as critic');

  // The participant presses the pin's marker (by keyboard: markers of other pins may overlap
  // it on screen): the list selects the pin and its thread opens.
  await openModel(participant, `${session.app.url}/revisions/${revisionId}`);
  const marker = participant.locator(`[data-pin-marker="${pinId}"]`);
  await expect.poll(() => marker.isVisible(), { timeout: 10_000 }).toBe(true);
  await marker.focus();
  await participant.keyboard.press('Enter');
  const thread = participant.getByTestId('pin-thread');
  await thread.waitFor();
  expect(await participant.getByTestId('pin-list').getByRole('button', { pressed: true }).getAttribute('data-pin-id')).toBe(pinId);
  expect(await marker.getAttribute('aria-pressed')).toBe('true');
  expect(await thread.locator('strong').first().innerText()).toBe('tab');
  expect(await thread.locator('img').count()).toBe(0);
  expect(await participant.evaluate(() => (globalThis as unknown as { __pinned?: number }).__pinned)).toBeUndefined();
  await thread.getByLabel(/Reply to pin/).fill('Widened to 8 mm in the next revision.');
  await thread.getByRole('button', { name: 'Send reply' }).click();
  await expect.poll(() => thread.innerText()).toContain('Widened to 8 mm in the next revision.');
  await thread.getByRole('button', { name: 'Resolve' }).click();
  await thread.getByRole('button', { name: 'Reopen' }).waitFor();
  await expectAccessible(participant, 'the revision page with a thread open, as participant');

  // The critic's page catches up by itself (it asks every 5 s).
  await expect.poll(() => row.innerText(), { timeout: 15_000, interval: 500 }).toContain('1 reply');
  expect(await row.innerText()).toContain('Resolved');
  expect(await critic.locator(`[data-pin-marker="${pinId}"]`).getAttribute('data-state')).toBe('resolved');

  expect(problems).toEqual([]);
  expect(participantProblems).toEqual([]);
});

/**
 * The studio's whole loop in the browser: the instructor writes and publishes a brief; a
 * participant uploads a revision that fails, reads the finding that says why, uploads the fixed
 * design and sees it pass; the instructor finds the submission in the table with the fixed
 * revision's figures and both revisions in its history. The designs are the demo's own
 * (server/seed/designs, figures in its README).
 *
 * The loop opens each page by its address (as from a bookmark or an e-mail link); following the
 * links out of the studio page and the submissions table is the second test's subject.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Locator, Page } from 'playwright-core';
import { expect, it } from 'vitest';
import { useAppAndBrowser, watchPage } from './support/app.js';
import { expectAccessible, signIn, signOut } from './support/pages.js';

const STUDIO = 'Quillmarsh Lamp Studio';
const BRIEF = 'Lantern of keels and panels';
const PARTICIPANT = { email: 'participant@example.org', name: 'Kofi Mensah-Lowe' };
const designs = fileURLToPath(new URL('../../server/seed/designs/', import.meta.url));
const FAILING = join(designs, 'i-half-keels.json');
const FIXED = join(designs, 'i-keel-lantern.json');

const session = useAppAndBrowser();

/** The text of each cell of a table row, in column order. */
async function cellTexts(row: Locator): Promise<string[]> {
  return (await row.getByRole('cell').allInnerTexts()).map((t) => t.replace(/\s+/g, ' ').trim());
}

/** Uploads a design document on the brief's page and waits until its audit is done. */
async function uploadAndWait(page: Page, file: string): Promise<void> {
  const form = page.getByRole('form', { name: 'Upload a revision' });
  await form.getByLabel('Design document (.json)').setInputFiles(file);
  await form.getByRole('button', { name: 'Upload revision' }).click();
  await page.waitForURL(/\/revisions\/\d+$/, { timeout: 15_000 });
  await page.getByText('The audit is done.').waitFor({ timeout: 30_000 });
}

it('a brief is published, a failing revision is fixed, and the instructor sees both', { timeout: 180_000 }, async () => {
  const page = await session.browser.context.newPage();
  const { problems } = watchPage(page);

  // The instructor writes the brief: I only, the shell on the 3-fold planes, keels on the 2-fold.
  await signIn(page, session.app.url, 'instructor@example.org');
  await page.goto(`${session.app.url}/studios/1/briefs/new`);
  const editor = page.getByRole('form', { name: 'New brief' });
  await editor.getByLabel('Title').fill(BRIEF);
  await editor.getByLabel('Brief text (markdown)').fill('A hanging lantern under **I**: panels on the 3-fold planes, keels on the 2-fold planes.');
  await expect(editor.getByLabel('I — icosahedral (order 60)').isChecked()).resolves.toBe(true);
  await editor.getByRole('button', { name: 'Add a required family' }).click();
  const required = editor.getByRole('group', { name: 'Required family 1' });
  await required.getByLabel('Fold (2, 3, 4, 5 or n)').fill('3');
  await required.getByLabel('Offset from (mm)').fill('60');
  await required.getByLabel('Offset to (mm)').fill('160');
  await editor.getByRole('button', { name: 'Add an allowed family' }).click();
  const allowed = editor.getByRole('group', { name: 'Allowed family 1' });
  await allowed.getByLabel('Fold (2, 3, 4, 5 or n)').fill('2');
  await allowed.getByLabel('Offset from (mm)').fill('10');
  await allowed.getByLabel('Offset to (mm)').fill('80');
  const material = editor.getByRole('combobox', { name: 'Material', exact: true });
  const birch = await material.locator('option', { hasText: 'Birch plywood 3 mm' }).first().getAttribute('value');
  expect(birch).toBeTruthy();
  await material.selectOption(birch!);
  await editor.getByLabel('Sheet width (mm)').fill('600');
  await editor.getByLabel('Sheet height (mm)').fill('400');
  await editor.getByLabel('Maximum sheets').fill('3');
  await editor.getByLabel('Minimum joint length (mm)').fill('6');
  await expectAccessible(page, 'new brief');
  await editor.getByRole('button', { name: 'Publish brief' }).click();
  await page.waitForURL(/\/briefs\/\d+$/, { timeout: 15_000 });
  const briefUrl = page.url();
  await page.getByRole('heading', { name: BRIEF }).waitFor();
  await signOut(page);

  // The participant finds the brief in the studio and uploads half keels: 20 loose clusters.
  await signIn(page, session.app.url, PARTICIPANT.email);
  await page.goto(briefUrl);
  await uploadAndWait(page, FAILING);
  await page.getByText('1 error to fix before the design can be cut').waitFor();
  const findings = page.getByRole('table', { name: 'Findings of the audit' });
  const disconnected = findings.getByRole('row').filter({ has: page.getByRole('cell', { name: 'disconnected', exact: true }) });
  await expect(disconnected.count()).resolves.toBe(1);
  await expect(disconnected.innerText()).resolves.toMatch(/20 separate groups/);
  await expect(findings.getByRole('row').filter({ hasText: /^\s*error/i }).count()).resolves.toBe(1);
  await expectAccessible(page, 'audit of the failing revision');

  // The fixed design: full keels, each holding two panels.
  await page.goto(briefUrl);
  await uploadAndWait(page, FIXED);
  await page.getByText('No errors: the design passes the brief.').waitFor();
  await expect(page.getByRole('cell', { name: 'disconnected', exact: true }).count()).resolves.toBe(0);
  await signOut(page);

  // The instructor's table shows the submission at revision 2 with the lantern's figures.
  await signIn(page, session.app.url, 'instructor@example.org');
  await page.goto(briefUrl);
  await page.getByRole('link', { name: 'Submissions' }).first().click();
  await page.waitForURL(/\/briefs\/\d+\/submissions$/);
  const table = page.getByRole('table', { name: 'Submissions' });
  const row = table.getByRole('row').filter({ hasText: PARTICIPANT.name });
  await row.first().waitFor();
  await expect(row.count()).resolves.toBe(1);
  // The first column is the model's picture.
  const [, participant, revision, audit, errors, warnings, pieces, sheets, late] = await cellTexts(row);
  expect(participant).toContain(PARTICIPANT.email);
  expect(revision).toMatch(/^Revision 2\b/);
  expect(audit).toMatch(/done/i);
  expect({ errors, warnings, pieces, sheets, late }).toEqual({ errors: '0', warnings: '0', pieces: '80', sheets: '2', late: 'on time' });
  await expectAccessible(page, 'submissions table');

  // Both revisions are in the submission's history: 1 error and 20 groups, then none and one.
  const revisionHref = await row.getByRole('link', { name: `Revision 2 of ${PARTICIPANT.name}` }).getAttribute('href');
  expect(revisionHref).toMatch(/^\/revisions\/\d+$/);
  await page.goto(`${session.app.url}${revisionHref}`);
  const history = page.getByRole('list', { name: 'Revision history' });
  const entries = history.getByRole('listitem').filter({ has: page.getByRole('link', { name: /^Revision \d+$/ }) });
  await entries.first().waitFor();
  const texts = (await entries.allInnerTexts()).map((t) => t.replace(/\s+/g, ' '));
  expect(texts).toHaveLength(2);
  expect(texts[0]).toMatch(/Revision 2[\s\S]*0 errors · 0 warnings · 80 pieces · 1 component · 2 sheets/);
  expect(texts[1]).toMatch(/Revision 1[\s\S]*1 error · 0 warnings · 80 pieces · 20 components · 2 sheets/);

  await page.close();
  // Signing out on a revision's page can catch its query refetching: answered 401 by contract.
  expect(problems.filter((p) => !/^HTTP 401: \/api\/revisions\/\d+$/.test(p))).toEqual([]);
});

it('the links out of the studio page, the submissions table and a revision page open their pages', { timeout: 120_000 }, async () => {
  await session.browser.context.clearCookies();
  const page = await session.browser.context.newPage();
  const { problems } = watchPage(page);
  const heading = () => page.getByRole('heading', { level: 1 });

  await signIn(page, session.app.url, 'instructor@example.org');
  await page.getByRole('link', { name: STUDIO }).first().click();
  await heading().filter({ hasText: STUDIO }).waitFor();
  await page.getByRole('link', { name: 'New brief' }).click();
  await heading().filter({ hasText: 'New brief' }).waitFor({ timeout: 15_000 });

  await page.goto(`${session.app.url}/studios/1`);
  await page.getByRole('list', { name: 'Briefs' }).getByRole('link', { name: 'Icosahedral lantern', exact: true }).click();
  await heading().filter({ hasText: 'Icosahedral lantern' }).waitFor({ timeout: 15_000 });

  await page.getByRole('link', { name: 'Submissions' }).first().click();
  await heading().filter({ hasText: 'Submissions' }).waitFor({ timeout: 15_000 });
  await page.getByRole('table', { name: 'Submissions' }).getByRole('link', { name: /^Revision \d+ of / }).first().click();
  await page.waitForURL(/\/revisions\/\d+$/, { timeout: 15_000 });
  await heading().filter({ hasText: /^Revision \d+/ }).waitFor({ timeout: 15_000 });
  // From an audit with findings back to its brief, as a participant does before uploading again.
  const briefLink = page.getByRole('main').getByRole('link', { name: 'Icosahedral lantern', exact: true });
  await briefLink.click();
  await heading().filter({ hasText: 'Icosahedral lantern' }).waitFor({ timeout: 15_000 });

  await page.close();
  expect(problems).toEqual([]);
});

/**
 * An instructor invites a new person; the e-mail arrives through the real SMTP sink and shows in
 * the admin's outbox; its link creates an account that lands in the studio with the invited role.
 */
import { expect, it } from 'vitest';
import { useAppAndBrowser, watchPage } from './support/app.js';
import { expectAccessible, signIn, signOut } from './support/pages.js';

const STUDIO = 'Quillmarsh Lamp Studio';
const INVITEE = 'wren.halloway@example.org';
const session = useAppAndBrowser();

it('an invitation goes out, appears in the outbox, and its link creates a critic in the studio', async () => {
  const page = await session.browser.context.newPage();
  const { problems } = watchPage(page);

  await signIn(page, session.app.url, 'instructor@example.org');
  await page.getByRole('link', { name: STUDIO }).first().click();
  const form = page.getByRole('form', { name: 'Invite someone' });
  await form.getByLabel('E-mail address').fill(INVITEE);
  await form.getByLabel('Role in this studio').selectOption('critic');
  await form.getByRole('button').click();
  await page.getByText(INVITEE).first().waitFor();
  await signOut(page);

  await signIn(page, session.app.url, 'admin@example.org');
  await page.goto(`${session.app.url}/admin/outbox`);
  await page.getByText(new RegExp(STUDIO)).first().click();
  const link = page.getByRole('link', { name: /\/invitations\// }).first();
  const href = new URL((await link.getAttribute('href')) ?? '', session.app.url).toString();
  expect(href).toMatch(/\/invitations\/[A-Za-z0-9_-]{20,}$/);
  await expectAccessible(page, 'outbox message');
  await signOut(page);

  await page.goto(href);
  await page.getByRole('form', { name: 'Create your account' }).waitFor();
  await expectAccessible(page, 'invitation');
  await page.getByLabel('Your name').fill('Wren Halloway');
  await page.getByLabel('Password', { exact: true }).fill('lantern-ribs-2026');
  await page.getByLabel('Repeat the password').fill('lantern-ribs-2026');
  await page.getByRole('button', { name: /create/i }).click();
  await page.waitForURL(/\/studios\/\d+/);
  await page.getByRole('heading', { name: STUDIO }).waitFor();
  await page.getByRole('cell', { name: /Wren Halloway/ }).first().waitFor();

  const me = (await page.evaluate(async () => (await fetch('/api/auth/me')).json())) as { email: string; memberships: unknown[] };
  expect(me.email).toBe(INVITEE);
  expect(me.memberships).toEqual([expect.objectContaining({ studioName: STUDIO, role: 'critic' })]);

  // The link works once.
  await signOut(page);
  await page.goto(href);
  await page.getByText(/already been used|no longer|used/i).first().waitFor();
  await page.close();
  // The second visit of the used link is answered 410 by contract.
  expect(problems.filter((p) => !/^HTTP 410: \/api\/invitations\//.test(p))).toEqual([]);
});

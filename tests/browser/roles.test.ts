/**
 * Each demo role signs in and sees what it should, and not what it should not; every page
 * visited is checked with axe-core for serious or critical violations.
 */
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { useAppAndBrowser, watchPage } from './support/app.js';
import { expectAccessible, signIn } from './support/pages.js';

const STUDIO = 'Quillmarsh Lamp Studio';
const session = useAppAndBrowser();

async function freshPage(): Promise<{ page: Page; problems: string[] }> {
  await session.browser.context.clearCookies();
  const page = await session.browser.context.newPage();
  return { page, ...watchPage(page) };
}

const nav = (page: Page) => page.getByRole('navigation', { name: 'Main' });

describe('signed out', () => {
  it('when a visitor opens a page they are sent to sign in, which is accessible', async () => {
    const { page, problems } = await freshPage();
    await page.goto(`${session.app.url}/`);
    await page.waitForURL(/\/sign-in/);
    await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toMatch(/sign in/i);
    await expectAccessible(page, 'sign-in');
    await page.getByLabel('E-mail').fill('instructor@example.org');
    await page.getByLabel('Password', { exact: true }).fill('not-the-password');
    await page.getByRole('button', { name: /^sign in$/i }).click();
    await expect(page.getByText(/e-mail or password/i).first().waitFor()).resolves.toBeUndefined();
    expect(page.url()).toMatch(/\/sign-in/);
    await page.close();
    // The wrong password is answered 401 by contract.
    expect(problems.filter((p) => p !== 'HTTP 401: /api/auth/login')).toEqual([]);
  });
});

describe('each demo role', () => {
  it('admin sees the admin pages and every studio', async () => {
    const { page, problems } = await freshPage();
    await signIn(page, session.app.url, 'admin@example.org');
    await expectAccessible(page, 'admin dashboard');
    for (const link of ['Users', 'Outbox']) await expect(nav(page).getByRole('link', { name: link }).count()).resolves.toBe(1);
    await nav(page).getByRole('link', { name: 'Users' }).click();
    await page.getByRole('cell', { name: 'instructor@example.org' }).first().waitFor();
    await expectAccessible(page, 'admin users');
    await nav(page).getByRole('link', { name: 'Outbox' }).click();
    await page.waitForURL(/\/admin\/outbox/);
    await expectAccessible(page, 'admin outbox');
    await page.close();
    expect(problems).toEqual([]);
  });

  it('instructor sees the studio with its members and the invite form', async () => {
    const { page, problems } = await freshPage();
    await signIn(page, session.app.url, 'instructor@example.org');
    await expect(nav(page).getByRole('link', { name: 'Users' }).count()).resolves.toBe(0);
    await page.getByRole('link', { name: STUDIO }).first().click();
    await page.getByRole('heading', { name: 'Invite someone' }).waitFor();
    await page.getByRole('cell', { name: /Kofi Mensah-Lowe/ }).first().waitFor();
    await expectAccessible(page, 'studio as instructor');
    await page.close();
    expect(problems).toEqual([]);
  });

  for (const role of ['critic', 'participant'] as const) {
    it(`${role} sees the studio and its members but cannot invite or manage`, async () => {
      const { page, problems } = await freshPage();
      await signIn(page, session.app.url, `${role}@example.org`);
      await expect(nav(page).getByRole('link', { name: 'Users' }).count()).resolves.toBe(0);
      await page.getByRole('link', { name: STUDIO }).first().click();
      await page.getByRole('heading', { name: 'Members' }).waitFor();
      await page.getByRole('cell', { name: /Tomasz Elberg/ }).first().waitFor();
      await expect(page.getByRole('heading', { name: 'Invite someone' }).count()).resolves.toBe(0);
      await expect(page.getByRole('heading', { name: 'Pending invitations' }).count()).resolves.toBe(0);
      await expectAccessible(page, `studio as ${role}`);
      await page.close();
      expect(problems).toEqual([]);
    });
  }

  it('technician has no studio and no admin pages', async () => {
    const { page, problems } = await freshPage();
    await signIn(page, session.app.url, 'technician@example.org');
    await expect(page.getByRole('link', { name: STUDIO }).count()).resolves.toBe(0);
    await expect(nav(page).getByRole('link', { name: 'Users' }).count()).resolves.toBe(0);
    await expectAccessible(page, 'technician dashboard');
    await page.goto(`${session.app.url}/admin/users`);
    await expect(page.getByRole('cell', { name: 'instructor@example.org' }).count()).resolves.toBe(0);
    await page.getByText(/admin/i).first().waitFor();
    await page.close();
    expect(problems.filter((p) => !/^HTTP 403: \/api\/admin\//.test(p))).toEqual([]);
  });
});

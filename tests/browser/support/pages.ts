/**
 * Steps a person takes in the app, shared by the browser tests.
 */
import AxeBuilder from '@axe-core/playwright';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';
import { DEMO_PASSWORD } from './app.js';

export async function signIn(page: Page, baseUrl: string, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: /^sign in$/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 15_000 });
}

export async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: /sign out/i }).first().click();
  await page.waitForURL((url) => url.pathname.startsWith('/sign-in'), { timeout: 15_000 });
}

/** Runs axe-core on the page and fails on serious or critical violations, listing them. */
export async function expectAccessible(page: Page, where: string): Promise<void> {
  const result = await new AxeBuilder({ page: page as never }).analyze();
  const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  const summary = bad.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join('; ')}`);
  expect(summary, `axe-core on ${where}`).toEqual([]);
}

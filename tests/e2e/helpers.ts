import { expect, type Page } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { mkdirSync } from 'node:fs';

export const DEMO_PASSWORD = 'spark-demo-2026';
export type DemoRole = 'admin' | 'author' | 'lead' | 'tech' | 'trainer';
export const SCREENSHOT_DIR = 'test-results/screenshots';

/** Signs in through the real sign-in page and waits for the app shell. */
export async function signIn(page: Page, who: DemoRole): Promise<void> {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(`${who}@larkspur.test`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('navigation', { name: 'Areas' })).toBeVisible();
}

/** Saves a full-page screenshot into the test output, named for what it shows. */
export async function shot(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  await page.screenshot({ path: `${SCREENSHOT_DIR}/${name}.png`, fullPage: true });
}

/** axe-core scan of the current page; fails on any serious or critical violation. */
export async function axe(page: Page): Promise<void> {
  const result = await new AxeBuilder({ page }).analyze();
  const bad = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(bad.map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')})`)).toEqual([]);
}

/**
 * The procedures (by slug) whose versions this phone keeps in IndexedDB. The start page keeps
 * them one by one after it loads, so a test waits for the ones it needs, not for a count.
 */
export const keptSlugs = (page: Page) => page.evaluate(() => new Promise<string[]>((resolve) => {
  const open = indexedDB.open('sparkwright-bench');
  open.onsuccess = () => {
    const db = open.result;
    if (!db.objectStoreNames.contains('versions')) { db.close(); resolve([]); return; }
    const all = db.transaction('versions').objectStore('versions').getAll();
    all.onsuccess = () => { db.close(); resolve((all.result as { slug: string }[]).map((v) => v.slug)); };
  };
}));

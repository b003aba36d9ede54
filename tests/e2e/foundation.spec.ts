import { test, expect } from '@playwright/test';
import { signIn, shot, axe, type DemoRole } from './helpers';

// Which areas each demo role sees (shared/schema/roles.ts AREA_ROLES is the rule).
const EXPECTED: Record<DemoRole, { areas: string[]; home: string }> = {
  admin: { areas: ['Shop'], home: '/shop' },
  author: { areas: ['Bench', 'Drafting'], home: '/bench' },
  lead: { areas: ['Bench', 'Drafting', 'Debrief'], home: '/bench' },
  tech: { areas: ['Bench'], home: '/bench' },
  trainer: { areas: ['Debrief'], home: '/debrief' },
};
const ALL = ['Bench', 'Drafting', 'Debrief', 'Shop'];

test('the sign-in page is readable and passes an accessibility scan', async ({ page }) => {
  await page.goto('/sign-in');
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await shot(page, 'foundation-sign-in');
  await axe(page);
});

test('the sign-in page logs no console error before anyone signs in', async ({ page }) => {
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(m.text()); });
  page.on('response', (r) => { if (r.status() >= 400) errors.push(`${r.status()} ${r.url()}`); });
  await page.goto('/sign-in');
  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await page.waitForLoadState('networkidle');
  expect(errors).toEqual([]);
});

test('a wrong password shows a clear message and keeps the person on the sign-in page', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('tech@larkspur.test');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByText('do not match an account')).toBeVisible();
  await expect(page).toHaveURL(/sign-in/);
});

for (const role of Object.keys(EXPECTED) as DemoRole[]) {
  test(`the ${role} sees only the areas of that role, each without serious accessibility problems`, async ({ page }) => {
    await signIn(page, role);
    const nav = page.getByRole('navigation', { name: 'Areas' });
    await expect(page).toHaveURL(new RegExp(EXPECTED[role].home));
    for (const area of ALL) {
      const link = nav.getByRole('link', { name: area, exact: true });
      if (EXPECTED[role].areas.includes(area)) await expect(link).toBeVisible();
      else await expect(link).toHaveCount(0);
    }
    for (const area of EXPECTED[role].areas) {
      await nav.getByRole('link', { name: area, exact: true }).click();
      await expect(page).toHaveURL(new RegExp(`/${area.toLowerCase()}`));
      await page.waitForLoadState('networkidle');
      await shot(page, `foundation-${role}-${area.toLowerCase()}`);
      await axe(page);
    }
    // an area outside the role is refused on the client too (the server refuses its API)
    const other = ALL.find((a) => !EXPECTED[role].areas.includes(a))!;
    await page.goto(`/${other.toLowerCase()}`);
    await expect(page.getByText('not part of your role')).toBeVisible();
  });
}

test('the admin adds a machine with a VIN whose check digit is wrong and is told so', async ({ page }) => {
  await signIn(page, 'admin');
  await page.goto('/shop/machines');
  await page.getByRole('button', { name: 'Add a machine' }).click();
  await page.getByLabel('Label').fill('E2E-1');
  // 49 CFR 565.15 example VIN with its check digit X replaced by 5
  await page.getByLabel('Frame number or VIN').fill('1M8GDM9A5KP042788');
  await page.getByRole('button', { name: 'Add machine' }).click();
  await expect(page.getByText("check digit (9th character) is 5")).toBeVisible();
  await page.getByLabel('Frame number or VIN').fill('1M8GDM9AXKP042788');
  await expect(page.getByText('VIN check digit is correct.')).toBeVisible();
  await page.getByRole('button', { name: 'Add machine' }).click();
  await expect(page.getByRole('cell', { name: 'E2E-1', exact: true })).toBeVisible();
  await shot(page, 'foundation-admin-machines');
});

test('an invitation e-mail lands in the local receiver and its link creates a member once', async ({ page, browser }) => {
  await signIn(page, 'admin');
  await page.goto('/shop/members');
  const email = `new-tech-${Date.now()}@larkspur.test`;
  await page.getByLabel('E-mail').fill(email);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation sent to ${email}`)).toBeVisible();
  await page.goto('/shop/mail');
  const mail = page.getByRole('article').filter({ hasText: email }).first();
  await expect(mail).toBeVisible();
  const text = await mail.textContent();
  const link = /http:\/\/localhost:\d+\/invitation\?token=[\w-]+/.exec(text ?? '')?.[0];
  expect(link).toBeTruthy();
  const fresh = await browser.newContext();
  const p2 = await fresh.newPage();
  await p2.goto(link!);
  await p2.getByLabel('Your name').fill('Newly Invited');
  await p2.getByLabel('Choose a password').fill('a-long-enough-password');
  await p2.getByRole('button', { name: 'Join the shop' }).click();
  await expect(p2.getByRole('navigation', { name: 'Areas' })).toBeVisible();
  await expect(p2).toHaveURL(/bench/);
  await fresh.close();
  const again = await browser.newContext();
  const p3 = await again.newPage();
  await p3.goto(link!);
  await expect(p3.getByText('expired or was already used')).toBeVisible();
  await again.close();
});

import { test, expect } from '@playwright/test';
import { signIn, shot, axe } from './helpers';

test('an admin disables a technician: the technician is signed out at once, and enabled again can sign back in', async ({ page, browser }) => {
  const phone = await (await browser.newContext()).newPage();
  await signIn(phone, 'tech');

  await signIn(page, 'admin');
  await page.goto('/shop/members');
  await page.getByRole('button', { name: 'Disable Casey Tech' }).click();
  // the row of that member alone (another member's address may contain this one)
  const row = page.getByRole('row').filter({ has: page.getByRole('button', { name: /^(Disable|Enable) Casey Tech$/ }) });
  await expect(row.getByText('Disabled')).toBeVisible();
  await shot(page, 'shop-members-disabled');
  await axe(page);

  await phone.goto('/bench');
  await expect(phone.getByRole('heading', { name: 'Sign in' })).toBeVisible();

  await page.getByRole('button', { name: 'Enable Casey Tech' }).click();
  await expect(row.getByText('Active')).toBeVisible();
  await signIn(phone, 'tech');
  await phone.context().close();
});

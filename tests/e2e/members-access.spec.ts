import { test, expect } from '@playwright/test';
import { signIn, shot, axe } from './helpers';

test('an admin disables a technician: the technician is signed out at once, and enabled again can sign back in', async ({ page, browser }) => {
  const phone = await (await browser.newContext()).newPage();
  await signIn(phone, 'tech');

  await signIn(page, 'admin');
  await page.goto('/shop/members');
  await page.getByRole('button', { name: 'Disable Casey Tech' }).click();
  const row = page.getByRole('row').filter({ hasText: 'tech@larkspur.test' });
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

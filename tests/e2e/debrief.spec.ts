import { test, expect as baseExpect } from '@playwright/test';
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../../server/db';
import { seedHistoryIfEmpty } from '../../server/seeders/history';
import { signIn, shot, axe } from './helpers';

// The shared 2-core machine can be slow to draw the first chart; allow for it.
const expect = baseExpect.configure({ timeout: 30_000 });

// A trainer with a coffee: opens the analytics of the demo "No spark" procedure, reads where most
// diagnoses ended, opens one of them, and leaves a coaching note. Screenshots of every Debrief view.

test.beforeAll(async () => {
  const sequelize = createSequelize(process.env.E2E_DATABASE_URL ?? '');
  try {
    const [shop] = await sequelize.query<{ id: string }>(`SELECT id FROM shops WHERE slug = 'larkspur-lane'`, { type: QueryTypes.SELECT });
    if (!shop) throw new Error('the demo shop is missing: the server seeds it at start');
    await seedHistoryIfEmpty({ sequelize }, shop.id, 300);
  } finally {
    await sequelize.close();
  }
});

test('a trainer finds where No spark diagnoses end, replays one and leaves a coaching note', async ({ page }) => {
  test.setTimeout(240_000);
  await signIn(page, 'trainer');
  await expect(page).toHaveURL(/\/debrief/);
  await page.getByRole('navigation', { name: 'Debrief' }).getByRole('link', { name: 'Procedure analytics' }).click();
  await expect(page.getByRole('heading', { name: /Analytics: No spark/i })).toBeVisible();
  const top = page.getByTestId('top-ending');
  await expect(top).toBeVisible();
  const ending = (await top.textContent())!.trim();
  expect(ending.length).toBeGreaterThan(0);
  await expect(page.getByRole('figure', { name: /Procedure graph/ })).toBeVisible();
  await shot(page, 'debrief-analytics-path');
  await axe(page);

  for (const [tab, name] of [['Findings', 'findings'], ['Readings', 'readings'], ['Time', 'time'], ['Check order', 'advisor']] as const) {
    await page.getByRole('tab', { name: tab }).click();
    await expect(page.getByRole('tabpanel', { name: tab })).toBeVisible();
    await expect(page.getByRole('status').filter({ hasText: /…/ })).toHaveCount(0);
    await shot(page, `debrief-analytics-${name}`);
  }
  await page.getByRole('tab', { name: 'Readings' }).click();
  await page.getByRole('button', { name: 'Table' }).first().click();
  await expect(page.getByRole('columnheader', { name: 'Median' }).first()).toBeVisible();

  await page.getByRole('tab', { name: 'Where diagnoses go' }).click();
  await page.getByRole('link', { name: 'Open these diagnoses' }).click();
  await expect(page.getByRole('heading', { name: 'Diagnoses' })).toBeVisible();
  const rows = page.getByRole('row');
  await expect(rows.nth(1)).toContainText(ending);
  await shot(page, 'debrief-diagnoses');
  await axe(page);

  await rows.nth(1).getByRole('link').first().click();
  await expect(page.getByRole('heading', { name: 'Timeline' })).toBeVisible();
  await expect(page.getByText(`Ended: ${ending}`)).toBeVisible();
  await expect(page.getByRole('figure', { name: /path taken/ })).toBeVisible();
  const note = `Good work; check the plug cap before the coil next time (${Date.now()}).`;
  await page.getByLabel('Coaching note').fill(note);
  await page.getByRole('button', { name: 'Add note' }).click();
  await expect(page.getByText(note)).toBeVisible();
  await shot(page, 'debrief-replay');
  await axe(page);
});

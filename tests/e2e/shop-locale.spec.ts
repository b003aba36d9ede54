import { test, expect, type APIRequestContext, type Page } from '@playwright/test';
import { signIn, shot, axe } from './helpers';

// Issue 11 point 7: dates and numbers follow the shop's locale. The browser here is en-US; the
// shop is set to de-DE, whose CLDR conventions are the decimal comma, day-first dates with the
// abbreviated month ("2. Dez. 2026") and the 24-hour clock.

const germanDate = /\d{1,2}\. \p{L}{3,4}\.? \d{4}/u;
const germanDateTime = new RegExp(`${germanDate.source}, \\d{2}:\\d{2}`, 'u');

/** Sets the shop's locale back over the API, so later specs see the browser's own again. */
async function resetLocale(request: APIRequestContext): Promise<void> {
  const { token } = await (await request.get('/api/auth/csrf')).json() as { token: string };
  const settings = await (await request.get('/api/shop/settings')).json() as Record<string, unknown>;
  const res = await request.put('/api/shop/settings', { headers: { 'x-csrf-token': token }, data: { ...settings, locale: null } });
  expect(res.status()).toBe(200);
}

async function chooseGerman(page: Page): Promise<void> {
  await page.goto('/shop/settings');
  await expect(page.getByRole('heading', { name: 'Shop settings' })).toBeVisible();
  await page.getByLabel('Search languages and countries').fill('deutsch');
  const list = page.getByLabel('Locale', { exact: true });
  await expect(list.locator('option')).toHaveText([/^Each device's browser/, /· de-DE$/, /· de-AT$/, /· de-CH$/]);
  await list.selectOption('de-DE');
  await expect(page.getByTestId('locale-example')).toContainText('5,95 kΩ');
  await expect(page.getByTestId('locale-example')).toContainText(germanDate);
  await expect(page.getByTestId('locale-example')).toContainText('12.345 steps');
  await shot(page, 'shop-settings-locale');
  await axe(page);
  await page.getByRole('button', { name: 'Save settings' }).click();
  await expect(page.getByText('Saved.')).toBeVisible();
}

test('an admin sets the shop to de-DE; the Bench shows a reading back as 5,95 kΩ, 24-hour times and German dates', async ({ page, browser }) => {
  test.setTimeout(120_000);
  await signIn(page, 'admin');
  try {
    await chooseGerman(page);
    // The admin's own screens follow at once: the members list writes "Member since" in German order.
    await page.goto('/shop/members');
    await expect(page.getByRole('row', { name: /Casey Tech tech@larkspur.test/ })).toContainText(germanDate);

    const phone = await (await browser.newContext({ viewport: { width: 360, height: 780 }, hasTouch: true, locale: 'en-US' })).newPage();
    await signIn(phone, 'tech');
    await phone.getByRole('link', { name: 'Start a diagnosis' }).click();
    await phone.getByLabel('Symptom').fill('spark');
    await phone.getByRole('radio', { name: /^No spark/ }).check();
    await phone.getByLabel('Find a machine').fill('w-01');
    await phone.getByRole('radio', { name: /^W-01 Wren 50/ }).check();
    await phone.getByLabel("Complaint in the customer's words").fill('Kicks over, never fires');
    await phone.getByRole('button', { name: 'Start the diagnosis' }).click();
    await expect(phone).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
    const id = phone.url().split('/').pop()!;

    await phone.getByRole('button', { name: 'Done' }).click();
    await phone.getByRole('button', { name: 'I have read this and will keep clear' }).click();
    // CLDR de short time "HH:mm": two-digit hours, no AM/PM
    await expect(phone.getByTestId('acknowledged-mark')).toHaveText(/^✓Acknowledged at \d{2}:\d{2}$/);
    await phone.getByRole('button', { name: 'No spark' }).click();
    await phone.getByRole('button', { name: 'Done' }).click();
    await phone.getByRole('button', { name: 'I have read this and will keep clear' }).click();
    await phone.getByRole('button', { name: 'Still no spark' }).click();

    await phone.getByLabel('Reading (kΩ)').fill('5,95');
    await expect(phone.getByTestId('understood')).toHaveText('5,95 kΩ');
    await expect(phone.getByTestId('verdict')).toContainText('Value used: 5,95 kΩ');
    await expect(phone.getByTestId('verdict')).toContainText(/5,\d\d kΩ to 6,01 kΩ/);
    await shot(phone, 'bench-reading-de-DE');
    await phone.getByRole('button', { name: 'Save reading and continue' }).click();
    await expect(phone.getByRole('heading', { name: 'CDI and coil ground' })).toBeVisible();
    await expect(phone.getByRole('region', { name: 'Steps so far' }).or(phone.locator('section[aria-labelledby="path-title"]'))).toContainText('5,95 → 5,95 kΩ');
    await expect(phone.getByTestId('sync-status')).toHaveText('All synced', { timeout: 20_000 });

    await phone.goto(`/bench/d/${id}/record`);
    await expect(phone.getByRole('list', { name: 'Timeline' })).toBeVisible();
    await expect(phone.getByText(/started /)).toContainText(germanDateTime);
    await expect(phone.getByTestId('record-answer').filter({ hasText: '5,95' })).toHaveText(/^5,95 → 5,95 kΩ · limits 4 – 6 kΩ$/);
    await expect(phone.getByTestId('record-acknowledged').first()).toHaveText(/^DANGER note acknowledged at \d{2}:\d{2}$/);
    await shot(phone, 'bench-record-de-DE');
    await phone.context().close();
  } finally {
    await resetLocale(page.request);
  }
});

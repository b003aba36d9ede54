import { readFile } from 'node:fs/promises';
import { test, expect, type BrowserContext, type Page } from '@playwright/test';
import { signIn, shot, axe, keptSlugs } from './helpers';

// A technician's phone: narrow, touch. The demo "No spark" procedure is seeded as version 1.
test.use({ viewport: { width: 360, height: 780 }, hasTouch: true });

/** No signal: the browser says offline and API requests fail as they do without a network. */
async function signal(context: BrowserContext, page: Page, on: boolean): Promise<void> {
  if (on) await page.unroute('**/api/**');
  else await page.route('**/api/**', (route) => route.abort('internetdisconnected'));
  await context.setOffline(!on);
}

/** Starts "No spark" on a machine from the page already loaded (no reload: no signal) and answers the first step. */
async function startOffline(page: Page, machine: string): Promise<string> {
  await page.getByRole('link', { name: 'Start a diagnosis' }).click();
  await page.getByRole('radio', { name: /^No spark/ }).check();
  const label = machine.split(' ')[0]!;
  await page.getByLabel('Find a machine').fill(label);
  await page.getByRole('radio', { name: new RegExp(`^${label} `) }).check();
  await page.getByLabel("Complaint in the customer's words").fill('No spark since this morning');
  await page.getByRole('button', { name: 'Start the diagnosis' }).click();
  await expect(page).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
  await page.getByRole('button', { name: 'Done' }).click();
  await expect(page.getByRole('heading', { name: 'Spark test' })).toBeVisible();
  return page.url().split('/').pop()!;
}

/**
 * The machine of a queued start is swapped for one the shop does not have, as if it had been
 * removed while the phone had no signal: the real server then refuses the start (404).
 */
const machineRemovedMeanwhile = (page: Page, diagnosisId: string) => page.evaluate((id) => new Promise<void>((resolve, reject) => {
  const open = indexedDB.open('sparkwright-bench');
  open.onsuccess = () => {
    const tx = open.result.transaction('outbox', 'readwrite');
    tx.objectStore('outbox').openCursor().onsuccess = (e) => {
      const cursor = (e.target as IDBRequest<IDBCursorWithValue | null>).result;
      if (!cursor) return;
      const item = cursor.value as { diagnosisId: string; message: { kind: string; body: Record<string, unknown> } };
      if (item.diagnosisId === id && item.message.kind === 'start') cursor.update({ ...item, message: { ...item.message, body: { ...item.message.body, vehicleId: crypto.randomUUID() } } });
      cursor.continue();
    };
    tx.oncomplete = () => { open.result.close(); resolve(); };
    tx.onerror = () => reject(tx.error);
  };
}), diagnosisId);

test('a refused diagnosis waits on the phone while another syncs, and can be set aside and downloaded', async ({ page, context }) => {
  test.setTimeout(120_000);
  await signIn(page, 'tech');
  await page.goto('/bench');
  await page.getByRole('link', { name: 'Start a diagnosis' }).click();
  await expect(page.getByRole('radio', { name: /^No spark/ })).toBeVisible();
  await expect.poll(async () => (await keptSlugs(page)).length, { timeout: 20_000 }).toBeGreaterThanOrEqual(1);
  await expect.poll(() => keptSlugs(page), { timeout: 20_000 }).toContain('no-spark'); // "No spark" kept on the phone
  const benchNav = page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'Bench' });
  await benchNav.click(); // moving inside the app from here on: without signal there is no reload

  await signal(context, page, false);
  const removed = await startOffline(page, 'W-02 — Wren 50 two-stroke scooter');
  await benchNav.click();
  const fine = await startOffline(page, 'B-01 — Badger 110 youth quad');
  await expect(page.getByTestId('sync-status')).toContainText('4 waiting to sync');
  await machineRemovedMeanwhile(page, removed);

  await signal(context, page, true);
  const card = page.getByTestId('refused-diagnosis');
  await expect(card).toContainText('Not reaching the server: W-02 · No spark', { timeout: 20_000 });
  await expect(card).toContainText('That machine was not found in this shop');
  await expect(card).toContainText('Kept on this phone: the start and 1 step');
  await expect(page.getByTestId('sync-status')).toHaveText('2 waiting to sync', { timeout: 20_000 });
  await shot(page, 'bench-refused-other');
  const rec = await (await page.request.get(`/api/diagnoses/${fine}`)).json() as { steps: { stepId: string }[] };
  expect(rec.steps.map((s) => s.stepId)).toEqual(['prepare']); // the other diagnosis went past the refusal

  await page.goto(`/bench/d/${removed}`);
  await expect(card).toContainText('This diagnosis is not reaching the server');
  await shot(page, 'bench-refused-this');
  await page.getByRole('button', { name: 'Set aside' }).click();
  await expect(page.getByTestId('sync-status')).toHaveText('All synced · 1 diagnosis set aside on this phone');
  await expect(page.getByTestId('set-aside')).toContainText('This diagnosis was set aside: its record is not on the server');
  await axe(page);
  await shot(page, 'bench-set-aside');

  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: /^Download/ }).click()]);
  expect(download.suggestedFilename()).toMatch(/^set-aside-w-02-no-spark-\d{4}-\d{2}-\d{2}\.json$/);
  const file = JSON.parse(await readFile((await download.path())!, 'utf8')) as { diagnosis: { id: string }; messages: { kind: string; refused: string | null }[] };
  expect(file.diagnosis.id).toBe(removed);
  expect(file.messages.map((m) => m.kind)).toEqual(['start', 'step']);
  expect(file.messages[0]!.refused).toMatch(/^That machine was not found/);
  expect((await page.request.get(`/api/diagnoses/${removed}`)).status()).toBe(404);

  // Bench home lists it under the set-aside record, not as one to resume; once the lead has the
  // file, two taps take it off the phone.
  await page.goto('/bench');
  const resume = page.getByRole('region', { name: 'Resume on this phone' });
  await expect(resume).toContainText('B-01');
  await expect(resume).not.toContainText('W-02');
  await page.getByRole('button', { name: 'Remove from this phone W-02 · No spark' }).click();
  await shot(page, 'bench-set-aside-remove');
  await page.getByRole('button', { name: 'Yes, remove: my lead has the file' }).click();
  await expect(page.getByTestId('sync-status')).toHaveText('All synced');
  await expect(page.getByTestId('set-aside')).toHaveCount(0);
});

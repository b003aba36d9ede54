import { test, expect, type Page } from '@playwright/test';
import { signIn, shot, axe } from './helpers';

// A technician's phone: narrow, touch. In the demo, "No spark" continues in "Weak or intermittent
// spark" when the spark test shows a weak spark (issue 13 part 2).
test.use({ viewport: { width: 360, height: 780 }, hasTouch: true });

async function startNoSpark(page: Page): Promise<string> {
  await page.getByRole('link', { name: 'Start a diagnosis' }).click();
  await page.getByLabel('Symptom').fill('spark');
  await page.getByRole('radio', { name: /^No spark/ }).check();
  await page.getByLabel('Find a machine').fill('w-03');
  await page.getByRole('radio', { name: /^W-03/ }).check();
  await page.getByLabel("Complaint in the customer's words").fill('Spark looks thin and orange');
  await page.getByRole('button', { name: 'Start the diagnosis' }).click();
  await expect(page).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
  return page.url().split('/').pop()!;
}

test('a "No spark" diagnosis with a weak spark continues in "Weak or intermittent spark" and ends in one record', async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, 'tech');
  const id = await startNoSpark(page);

  await expect(page.getByRole('heading', { name: 'Prepare the machine' })).toBeVisible();
  await page.getByRole('button', { name: 'Done' }).click();
  await expect(page.getByRole('heading', { name: 'Spark test' })).toBeVisible();
  await page.getByRole('button', { name: 'I have read this and will keep clear' }).click();
  await page.getByRole('button', { name: 'Weak or orange spark' }).click();

  // Now in the weak-spark procedure, same diagnosis, same screen: its own first step.
  await expect(page.getByText('Remove the spark plug and lay it on a clean cloth')).toBeVisible();
  await expect(page).toHaveURL(new RegExp(`/bench/d/${id}$`));
  await shot(page, 'bench-linked-continued');
  await axe(page);
  await page.getByRole('button', { name: 'Done' }).click();
  await expect(page.getByRole('heading', { name: 'Inspect the spark plug' })).toBeVisible();
  await page.getByRole('button', { name: 'Wet, oily or carboned' }).click();

  await expect(page.getByRole('heading', { name: 'Spark plug worn or fouled' })).toBeVisible();
  await page.getByLabel('Spark present at the tester').check();
  await page.getByLabel('Engine starts and runs').check();
  await page.getByLabel('Every stop path (kill switch, key) stops the engine').check();
  await page.getByLabel('Labour time (minutes)').fill('15');
  await page.getByRole('button', { name: 'Finish the diagnosis' }).click();
  await expect(page.getByText('Diagnosis finished')).toBeVisible();
  await expect(page.getByTestId('sync-status')).toHaveText('All synced', { timeout: 20_000 });

  type Rec = { status: string; procedureSlug?: string; steps: { stepId: string; kind: string }[] };
  const read = async () => await (await page.request.get(`/api/diagnoses/${id}`)).json() as Rec;
  // the ending reaches the server through the phone's outbox: wait for the record to say so
  await expect.poll(async () => (await read()).status, { timeout: 20_000 }).toBe('finished');
  const rec = await read();
  expect(rec.steps.map((s) => s.stepId)).toEqual(['prepare', 'sparkTest', 'useWeakSpark', 'k1_prepare', 'k1_plugInspect', 'k1_plugReplace']);
  // One record: the phone's list holds this one diagnosis, not a second for the other procedure.
  const mine = await (await page.request.get('/api/diagnoses?status=finished')).json() as { id: string }[];
  expect(mine.filter((d) => d.id === id)).toHaveLength(1);

  await page.getByRole('link', { name: 'Open the record and report' }).click();
  await expect(page.getByRole('list', { name: 'Timeline' })).toBeVisible();
  await expect(page.getByRole('list', { name: 'Timeline' })).toContainText('continued in Weak or intermittent spark');
  await shot(page, 'bench-linked-record');
});

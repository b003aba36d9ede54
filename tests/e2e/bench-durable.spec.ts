import { test, expect, type Page } from '@playwright/test';
import { signIn } from './helpers';

// The step screen shows the next step in the task of the tap, while IndexedDB is still keeping
// the answer (src/features/bench/hooks/use-local-diagnosis.ts). The argument that no answer is
// lost: the write's transaction is opened and every request of it handed to IndexedDB in that
// same task, before the next step is drawn, so nothing the page does afterwards (a reload, going
// away) comes between the tap and the write, and the commit is asked for in that task too (without
// it, Chromium drops the transaction when the page goes away: the second reload below lost its
// answer before commitLocal asked). These tests reload at the harshest moment a page can:
// in the very task of the tap, and right after a real tap; the answer must be there after the reload.

test.use({ viewport: { width: 360, height: 780 }, hasTouch: true });

/** Steps never reach the server here, so whatever the reloaded page shows came from the phone. */
async function keepStepsOffTheServer(page: Page): Promise<void> {
  await page.route('**/api/diagnoses/*/steps', (route) => route.abort('internetdisconnected'));
}

/** The rows the phone keeps for a diagnosis, and the step messages waiting in its outbox, read straight from IndexedDB. */
const onThePhone = (page: Page, id: string) => page.evaluate((diagnosisId) => new Promise<{ rows: string[]; queued: string[] }>((resolve, reject) => {
  const open = indexedDB.open('sparkwright-bench');
  open.onerror = () => reject(open.error);
  open.onsuccess = () => {
    const tx = open.result.transaction(['diagnoses', 'outbox'], 'readonly');
    const d = tx.objectStore('diagnoses').get(diagnosisId);
    const q = tx.objectStore('outbox').getAll();
    tx.oncomplete = () => {
      const rows = ((d.result as { rows: { stepId: string }[] } | undefined)?.rows ?? []).map((r) => r.stepId);
      const queued = (q.result as { diagnosisId: string; message: { kind: string; body: { stepId: string } } }[])
        .filter((i) => i.diagnosisId === diagnosisId && i.message.kind === 'step').map((i) => i.message.body.stepId);
      open.result.close();
      resolve({ rows, queued });
    };
  };
}), id);

async function startNoSpark(page: Page): Promise<string> {
  await page.getByRole('link', { name: 'Start a diagnosis' }).click();
  await page.getByRole('radio', { name: /^No spark/ }).check();
  await page.getByLabel('Find a machine').fill('w-01');
  await page.getByRole('radio', { name: /^W-01 Wren 50/ }).check();
  await page.getByLabel("Complaint in the customer's words").fill('Dies when warm, then no spark');
  await page.getByRole('button', { name: 'Start the diagnosis' }).click();
  await expect(page).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
  await expect(page.getByRole('heading', { name: 'Prepare the machine' })).toBeVisible();
  return page.url().split('/').pop()!;
}

/** Taps the button and reloads the page in the same task, before the browser could do anything else. */
const tapAndReloadAtOnce = (page: Page, name: string) => page.evaluate((label) => {
  const button = [...document.querySelectorAll('button')].find((b) => b.textContent?.trim() === label);
  if (!button || button.disabled) throw new Error(`no button "${label}" to tap`);
  button.click();
  location.reload();
}, name);

test('an answer tapped just before a reload is still on the phone after it, and the walk goes on from it', async ({ page }) => {
  await signIn(page, 'tech');
  await keepStepsOffTheServer(page);
  const id = await startNoSpark(page);

  await Promise.all([page.waitForEvent('load'), tapAndReloadAtOnce(page, 'Done')]);
  await expect(page.getByRole('heading', { name: 'Spark test', exact: true })).toBeVisible();
  expect(await onThePhone(page, id)).toEqual({ rows: ['prepare'], queued: ['prepare'] });

  // A second answer the same way, behind a DANGER acknowledgement.
  await page.getByRole('button', { name: 'I have read this and will keep clear' }).click();
  await Promise.all([page.waitForEvent('load'), tapAndReloadAtOnce(page, 'No spark')]);
  await expect(page.getByRole('heading', { name: 'Isolate the stop circuit' })).toBeVisible();
  expect(await onThePhone(page, id)).toEqual({ rows: ['prepare', 'sparkTest'], queued: ['prepare', 'sparkTest'] });

  // A real tap, then a reload as soon as the next step shows.
  await page.getByRole('button', { name: 'Done' }).tap();
  const retest = page.getByRole('heading', { name: 'Spark test with the stop circuit isolated' });
  await expect(retest).toBeVisible();
  await page.reload();
  await expect(retest).toBeVisible();
  expect(await onThePhone(page, id)).toEqual({ rows: ['prepare', 'sparkTest', 'isolateStop'], queued: ['prepare', 'sparkTest', 'isolateStop'] });
  await expect(page.getByText('Steps so far')).toBeVisible();
  await expect(page.getByRole('listitem').filter({ hasText: 'Isolate the stop circuit' })).toHaveCount(1);
});

test('when the phone cannot keep an answer, the step comes back with the reason and nothing is half-stored', async ({ page }) => {
  await signIn(page, 'tech');
  await keepStepsOffTheServer(page);
  const id = await startNoSpark(page);
  // The phone's storage refuses the next write, as a full disk does (the transaction aborts).
  await page.evaluate(() => {
    const original = IDBObjectStore.prototype.put;
    IDBObjectStore.prototype.put = function put(this: IDBObjectStore, ...args: Parameters<IDBObjectStore['put']>) {
      if (this.name === 'diagnoses') { IDBObjectStore.prototype.put = original; this.transaction.abort(); }
      return original.apply(this, args);
    };
  });
  await page.getByRole('button', { name: 'Done' }).tap();
  await expect(page.getByTestId('storage-problem')).toContainText('could not save the last answer');
  await expect(page.getByRole('heading', { name: 'Prepare the machine' })).toBeVisible();
  expect(await onThePhone(page, id)).toEqual({ rows: [], queued: [] });
  // Answered again, it is kept.
  await page.getByRole('button', { name: 'Done' }).tap();
  await expect(page.getByRole('heading', { name: 'Spark test', exact: true })).toBeVisible();
  await expect(page.getByTestId('storage-problem')).toHaveCount(0);
  expect(await onThePhone(page, id)).toEqual({ rows: ['prepare'], queued: ['prepare'] });
});

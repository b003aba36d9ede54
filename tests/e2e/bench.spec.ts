import { PNG } from 'pngjs';
import jsQR from 'jsqr';
import { test, expect, type Browser, type Page, type BrowserContext } from '@playwright/test';
import { deflateSync } from 'node:zlib';
import { signIn, shot, axe, keptSlugs, DEMO_PASSWORD } from './helpers';

// A technician's phone: narrow, touch. The demo "No spark" procedure is seeded as version 1.
test.use({ viewport: { width: 360, height: 780 }, hasTouch: true });

/** A real 64×48 PNG (solid amber) built in memory, so the photo upload sends true image bytes. */
function pngBytes(): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => { let c = n; for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1; return c >>> 0; });
  const crc = (b: Buffer) => { let c = 0xffffffff; for (const x of b) c = crcTable[(c ^ x) & 0xff]! ^ (c >>> 8); return (c ^ 0xffffffff) >>> 0; };
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4); len.writeUInt32BE(data.length);
    const td = Buffer.concat([Buffer.from(type), data]);
    const c = Buffer.alloc(4); c.writeUInt32BE(crc(td));
    return Buffer.concat([len, td, c]);
  };
  const [w, h] = [64, 48];
  const ihdr = Buffer.alloc(13); ihdr.writeUInt32BE(w, 0); ihdr.writeUInt32BE(h, 4); ihdr[8] = 8; ihdr[9] = 2;
  const raw = Buffer.concat(Array.from({ length: h }, () => Buffer.concat([Buffer.from([0]), Buffer.from(Array.from({ length: w }, () => [0xf0, 0x8a, 0x24]).flat())])));
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

/** Waits until the service worker controls the page and holds what an offline reload needs. */
async function serviceWorkerReady(page: Page): Promise<void> {
  await page.evaluate(async () => { await navigator.serviceWorker.ready; });
  // The worker takes control at the next navigation, which also fetches "who am I" through it.
  await page.goto('/bench');
  await expect(page.getByRole('heading', { name: 'Bench' })).toBeVisible();
  expect(await page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
  await expect.poll(() => page.evaluate(async () => !!(await (await caches.open('sw-session')).match('/api/auth/session'))), { timeout: 20_000 }).toBe(true);
}

/** The fake receiver's mailbox through the admin mail API, signed in over the API (no page needed). */
async function adminMail(browser: Browser): Promise<{ subject: string; to: string[] }[]> {
  const context = await browser.newContext();
  try {
    const { token } = await (await context.request.get('/api/auth/csrf')).json() as { token: string };
    const login = await context.request.post('/api/auth/login', { headers: { 'x-csrf-token': token }, data: { email: 'admin@larkspur.test', password: DEMO_PASSWORD } });
    expect(login.status()).toBe(200);
    const res = await context.request.get('/api/shop/mail');
    expect(res.status()).toBe(200);
    return await res.json() as { subject: string; to: string[] }[];
  } finally {
    await context.close();
  }
}

async function goOffline(context: BrowserContext, page: Page): Promise<void> {
  await context.setOffline(true);
  await page.route('**/api/**', (route) => route.abort('internetdisconnected'));
}
async function goOnline(context: BrowserContext, page: Page): Promise<void> {
  await page.unroute('**/api/**');
  await context.setOffline(false);
}

async function startNoSpark(page: Page): Promise<string> {
  await page.getByRole('link', { name: 'Start a diagnosis' }).click();
  await page.getByLabel('Symptom').fill('spark');
  await page.getByRole('radio', { name: /^No spark/ }).check();
  await page.getByLabel('Find a machine').fill('w-01');
  await page.getByRole('radio', { name: /^W-01 Wren 50/ }).check();
  await page.getByLabel("Complaint in the customer's words").fill('It kicks over but never fires');
  await shot(page, 'bench-start');
  await page.getByRole('button', { name: 'Start the diagnosis' }).click();
  await expect(page).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
  return page.url().split('/').pop()!;
}

async function reading(page: Page, label: string, text: string, understood: RegExp, verdict: RegExp): Promise<void> {
  await page.getByLabel(label).fill(text);
  await expect(page.getByTestId('understood')).toHaveText(understood);
  await expect(page.getByTestId('verdict')).toContainText(verdict);
}
const save = (page: Page) => page.getByRole('button', { name: 'Save reading and continue' }).click();
const crank = async (page: Page, answer: string) => {
  await page.getByRole('button', { name: 'I have read this and will keep clear' }).click();
  await page.getByRole('button', { name: answer }).click();
};

test('a technician runs "No spark" to a Finding, partly without signal, and the server gets every step once and in order', async ({ page, context, browser }) => {
  test.setTimeout(240_000);
  await signIn(page, 'tech');
  await serviceWorkerReady(page);
  await shot(page, 'bench-home');
  const id = await startNoSpark(page);

  await expect(page.getByRole('heading', { name: 'Prepare the machine' })).toBeVisible();
  await expect(page.getByText("manufacturer's service data and local regulations come first").first()).toBeVisible();
  await shot(page, 'bench-task');
  await axe(page);
  await page.getByRole('button', { name: 'Done' }).click();

  await expect(page.getByRole('heading', { name: 'Spark test' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'No spark' })).toBeDisabled(); // DANGER first
  // Issue 11 point 2: the greyed answers say why, and the acknowledgement leaves a mark with its time.
  await expect(page.getByTestId('locked-reason')).toContainText('Answers are locked until you acknowledge the DANGER note');
  await shot(page, 'bench-danger');
  await page.getByRole('button', { name: 'I have read this and will keep clear' }).click();
  await expect(page.getByTestId('locked-reason')).toHaveCount(0);
  await expect(page.getByTestId('acknowledged-mark')).toHaveText(/^✓Acknowledged at \d{1,2}:\d{2}/);
  await shot(page, 'bench-danger-acknowledged');
  await shot(page, 'bench-observation');
  await page.getByRole('button', { name: 'No spark' }).click();

  // No signal from here: every answer waits on the phone.
  await goOffline(context, page);
  await page.getByRole('button', { name: 'Done' }).click();
  await crank(page, 'Still no spark');
  // Issue 11 point 1: a range from the path figures, never one number that jumps.
  await expect(page.getByTestId('progress')).toHaveText(/^4 done · about \d+–\d+ more after this one$/);
  // "Still no spark" took the long way round (the figures include the demo history, so the
  // wording is checked for a reason, not one fixed sentence); the exact case follows the cap reading.
  await expect(page.getByTestId('progress-why')).toHaveText(/^(Up from before: this answer leads to the longer branch|Down from before: this answer leads to a shorter branch|Depends on the answer to this step)\.$/);
  await shot(page, 'bench-progress');
  // Issue 11 point 4: the service-data sentence once in the limits box.
  await expect(page.getByTestId('limits-box').getByText(/service data/)).toHaveCount(1);
  // Issue 11 point 3: 5,95 kΩ against 4–6 kΩ is within under simple acceptance (ILAC-G8:09/2019
  // §4.2.1: the reading decides), but its interval crosses 6 kΩ; the screen says so and offers a re-measure.
  await reading(page, 'Reading (kΩ)', '5,95', /5\.95 kΩ/, /Within limits/);
  await expect(page.getByTestId('verdict')).toContainText('to 6.01 kΩ');
  await expect(page.getByTestId('crosses-limit')).toContainText('reaches past the 6 kΩ limit');
  await shot(page, 'bench-reading-crosses-limit');
  await page.getByTestId('crosses-limit').getByRole('button', { name: 'Measure again' }).click();
  await expect(page.getByLabel('Reading (kΩ)')).toHaveValue('');
  await expect(page.getByLabel('Reading (kΩ)')).toBeFocused();
  await page.getByRole('button', { name: 'Letters keypad (for 4K7, R47, 2k1)' }).click();
  await reading(page, 'Reading (kΩ)', '4K7', /4\.7 kΩ/, /Within limits/);
  await expect(page.getByTestId('crosses-limit')).toHaveCount(0);
  await shot(page, 'bench-reading');
  await save(page);
  await expect(page.getByTestId('sync-status')).toContainText('waiting to sync');

  await page.reload(); // still offline: the service worker serves the app, IndexedDB the diagnosis
  await expect(page.getByRole('heading', { name: 'CDI and coil ground' })).toBeVisible();
  await expect(page.getByTestId('progress-why')).toHaveText('Up from before: this answer leads to the longer branch.');
  await shot(page, 'bench-offline-reload');
  await reading(page, 'Reading (Ω)', '0,4', /0\.4 Ω/, /Within limits/);
  await save(page);
  await reading(page, 'Reading (°C)', '22', /22 °C/, /Within limits/);
  await save(page);
  // Change the temperature answer: the first one stays in the record, marked changed.
  // Going back sits behind one control: no Change button until it is opened (issue 17 point 8).
  await expect(page.getByRole('button', { name: /^Change (?!an earlier)/ })).toHaveCount(0);
  await page.getByRole('button', { name: 'Change an earlier answer…' }).click();
  await page.getByRole('button', { name: 'Change Engine temperature' }).click();
  await reading(page, 'Reading (°C)', '21', /21 °C/, /Within limits/);
  await save(page);
  await expect(page.getByRole('heading', { name: 'Coil primary resistance' })).toBeVisible();
  await reading(page, 'Reading (Ω)', '0.5', /0\.5 Ω/, /Within limits/);
  await save(page);
  await reading(page, 'Reading (kΩ)', '3.5k', /3\.5 kΩ/, /Within limits/);
  await save(page);

  await goOnline(context, page);
  await expect(page.getByTestId('computed')).toContainText('Secondary at 20 °C');
  await shot(page, 'bench-formula');
  await reading(page, 'Reading (Ω)', '2.1k', /2\.1 kΩ/, /Above limits/);
  await save(page);

  await expect(page.getByRole('heading', { name: 'Stator winding faulty' })).toBeVisible();
  await page.getByLabel('Add a photo').setInputFiles({ name: 'stator.png', mimeType: 'image/png', buffer: pngBytes() });
  await expect(page.getByRole('img', { name: 'Photo stator.png' })).toBeVisible();
  await page.getByLabel('Lot / date code').first().fill('LOT-2611');
  await page.getByLabel('Spark present at the tester').check();
  await page.getByLabel('Engine starts and runs').check();
  await page.getByLabel('Every stop path (kill switch, key) stops the engine').check();
  await page.getByLabel('Labour time (minutes)').fill('55');
  await shot(page, 'bench-finding');
  await page.getByRole('button', { name: 'Finish the diagnosis' }).click();
  await expect(page.getByText('Diagnosis finished')).toBeVisible();
  // Closed on the phone: nothing on the path can be reopened (issue 17 point 8).
  await expect(page.getByRole('button', { name: /^Change/ })).toHaveCount(0);
  await expect(page.getByTestId('sync-status')).toHaveText('All synced', { timeout: 20_000 });
  await expect.poll(async () => ((await (await page.request.get(`/api/diagnoses/${id}`)).json()) as { status: string }).status, { timeout: 20_000 }).toBe('finished');

  const rec = await (await page.request.get(`/api/diagnoses/${id}`)).json() as { status: string; steps: { id: string; seq: number; stepId: string; superseded: boolean; entered: string | null }[]; attachments: unknown[] };
  expect(rec.status).toBe('finished');
  expect(rec.steps.map((s) => [s.stepId, s.superseded])).toEqual([
    ['prepare', false], ['sparkTest', false], ['isolateStop', false], ['sparkRetest', false], ['capOhms', false], ['groundCheck', false],
    ['engineTemp', true], ['engineTemp', false], ['coilPrimary', false], ['coilSecondary', false], ['secondaryAt20', false],
    ['exciterOhms', false], ['statorFaulty', false],
  ]);
  expect(rec.steps.map((s) => s.seq)).toEqual(rec.steps.map((_, i) => i + 1));
  expect(new Set(rec.steps.map((s) => s.id)).size).toBe(rec.steps.length);
  expect(rec.steps.filter((s) => s.entered).map((s) => s.entered)).toEqual(['4K7', '0,4', '22', '21', '0.5', '3.5k', '2.1k']);
  expect(rec.attachments).toHaveLength(1);

  await page.getByRole('link', { name: 'Open the record and report' }).click();
  await expect(page.getByRole('list', { name: 'Timeline' })).toBeVisible();
  await expect(page.getByTestId('record-acknowledged').first()).toHaveText(/^DANGER note acknowledged at \d{1,2}:\d{2}/);
  await page.getByRole('button', { name: 'E-mail to the service desk' }).click();
  await expect(page.getByText('Sent to desk@larkspur.test')).toBeVisible();
  await shot(page, 'bench-record');

  await expect.poll(async () => (await adminMail(browser)).some((m) => m.subject.startsWith('Diagnosis report: W-01') && m.to.includes('desk@larkspur.test')), { timeout: 20_000 }).toBe(true);
});

/** Signs the technician in, starts "No spark" on W-01 and answers the spark test; returns the diagnosis id. */
async function throughSparkTest(page: Page, answer: string): Promise<string> {
  await signIn(page, 'tech');
  const id = await startNoSpark(page);
  await page.getByRole('button', { name: 'Done' }).click();
  await crank(page, answer);
  return id;
}

test('a hand-off ends the diagnosis with a reason and the leads get an e-mail', async ({ page, browser }) => {
  test.setTimeout(120_000);
  const id = await throughSparkTest(page, 'Strong blue spark');
  await expect(page.getByRole('heading', { name: 'Spark is present' })).toBeVisible();
  await shot(page, 'bench-handoff');
  await page.getByRole('button', { name: 'Hand off and notify the leads' }).click();
  await expect(page.getByText('Handed off')).toBeVisible();
  await expect(page.getByTestId('sync-status')).toHaveText('All synced', { timeout: 20_000 });
  await expect.poll(async () => ((await (await page.request.get(`/api/diagnoses/${id}`)).json()) as { status: string }).status, { timeout: 20_000 }).toBe('handed_off');
  await expect.poll(async () => (await adminMail(browser)).some((m) => m.subject.startsWith('Hand-off: W-01') && m.to.includes('lead@larkspur.test')), { timeout: 20_000 }).toBe(true);
});

test('a diagnosis started on one phone can be continued on another', async ({ page, browser }) => {
  test.setTimeout(120_000);
  const id = await throughSparkTest(page, 'No spark');
  const stepIds = async (p: Page) => ((await (await p.request.get(`/api/diagnoses/${id}`)).json()) as { steps: { stepId: string }[] }).steps.map((s) => s.stepId);
  await expect.poll(() => stepIds(page), { timeout: 20_000 }).toEqual(['prepare', 'sparkTest']);

  const other = await browser.newContext({ viewport: { width: 360, height: 780 }, hasTouch: true });
  const phone = await other.newPage();
  await signIn(phone, 'tech');
  // the card says who, when and where it waits, so two on the same machine can be told apart
  const card = phone.getByRole('link', { name: /Waiting at: Isolate the stop circuit/ }).first();
  await expect(card).toContainText(/last answer \d{1,2}[:.]\d{2}/);
  await expect(card).toContainText('Casey Tech · started');
  await shot(phone, 'bench-elsewhere');
  await phone.getByRole('button', { name: 'Continue W-01 on this phone' }).first().click();
  await expect(phone).toHaveURL(new RegExp(`/bench/d/${id}$`));
  await expect(phone.getByRole('heading', { name: 'Isolate the stop circuit' })).toBeVisible();
  await phone.getByRole('button', { name: 'Done' }).click();
  await expect.poll(() => stepIds(phone), { timeout: 20_000 }).toEqual(['prepare', 'sparkTest', 'isolateStop']);
  await expect(phone.getByTestId('sync-status')).toHaveText('All synced');
  await other.close();
});

test('without signal a diagnosis still starts from what the phone kept, and reaches the server when signal returns', async ({ page, context }) => {
  test.setTimeout(120_000);
  await signIn(page, 'tech');
  await serviceWorkerReady(page);
  await page.getByRole('link', { name: 'Start a diagnosis' }).click();
  await expect(page.getByRole('radio', { name: /^No spark/ })).toBeVisible();
  await expect.poll(async () => (await keptSlugs(page)).length, { timeout: 20_000 }).toBeGreaterThanOrEqual(3); // the demo's three procedures
  await expect.poll(() => keptSlugs(page), { timeout: 20_000 }).toEqual(expect.arrayContaining(['no-spark', 'weak-spark', 'will-not-stop']));

  await goOffline(context, page);
  await page.reload();
  await page.getByLabel('Symptom').fill('spark');
  await page.getByRole('radio', { name: /^No spark/ }).check();
  await page.getByLabel('Find a machine').fill('W-02');
  await page.getByRole('radio', { name: /^W-02 Wren 50/ }).check();
  await page.getByLabel("Complaint in the customer's words").fill('Died at the lights, no spark since');
  await page.getByRole('button', { name: 'Start the diagnosis' }).click();
  await expect(page).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
  const id = page.url().split('/').pop()!;
  await page.getByRole('button', { name: 'Done' }).click();
  await expect(page.getByRole('heading', { name: 'Spark test' })).toBeVisible();
  await expect(page.getByTestId('sync-status')).toContainText('2 waiting to sync'); // the start and one step
  await shot(page, 'bench-offline-start');

  await goOnline(context, page);
  await expect(page.getByTestId('sync-status')).toHaveText('All synced', { timeout: 20_000 });
  const rec = await (await page.request.get(`/api/diagnoses/${id}`)).json() as { complaint: string; steps: { stepId: string }[] };
  expect(rec.complaint).toBe('Died at the lights, no spark since');
  expect(rec.steps.map((s) => s.stepId)).toEqual(['prepare']);
});

test('a printed job card carries a QR code and a link that open the start with machine and procedure picked', async ({ page }) => {
  await signIn(page, 'tech');
  const res = await page.request.get('/api/vehicles');
  const vehicles = await res.json() as { id: string; label: string }[];
  expect(res.status(), JSON.stringify(vehicles)).toBe(200);
  const w02 = vehicles.find((v) => v.label === 'W-02')!;
  await page.goto(`/bench/job-card?vehicle=${w02.id}&procedure=no-spark`);
  const link = page.getByTestId('job-link');
  await expect(link).toContainText(`/bench/start?vehicle=${w02.id}&procedure=no-spark`);
  const url = (await link.textContent())!.trim();
  // The QR code as the page draws it, read back with a QR decoder: a phone camera reads the same.
  const qr = page.getByTestId('job-qr');
  await expect(qr).toBeVisible();
  const png = PNG.sync.read(await qr.screenshot());
  expect(jsQR(new Uint8ClampedArray(png.data), png.width, png.height)?.data).toBe(url);
  await shot(page, 'bench-job-card');
  await page.goto(url);
  await expect(page.getByRole('radio', { name: /^No spark/ })).toBeChecked();
  await expect(page.getByRole('radio', { name: /^W-02 Wren 50/ })).toBeChecked();
});

test('the start page finds a machine by model or frame number, whole cards are the targets, and a technician adds a machine inline', async ({ page }) => {
  await signIn(page, 'tech');
  await page.goto('/bench/start');
  const procedure = page.getByRole('radio', { name: /^No spark/ });
  await expect(procedure).toBeVisible();
  // the whole card is the target (48 px on the Bench), and its circle is not squeezed
  const card = page.locator('label', { has: procedure });
  expect((await card.boundingBox())!.height).toBeGreaterThanOrEqual(48);
  const circle = (await procedure.boundingBox())!;
  expect(Math.min(circle.width, circle.height)).toBeGreaterThanOrEqual(20);
  await card.getByText(/version \d+/).click();
  await expect(procedure).toBeChecked();

  await page.getByLabel('Find a machine').fill('quad');
  const machines = page.getByRole('radiogroup', { name: 'Machines' }).getByRole('radio');
  await expect(machines.first()).toBeVisible();
  for (const name of await machines.evaluateAll((els) => els.map((e) => e.closest('label')!.textContent!))) expect(name).toMatch(/quad/i);
  await page.getByLabel('Find a machine').press('Tab');
  await page.keyboard.press('Space'); // the keyboard picks a machine too
  await expect(machines.first()).toBeChecked();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(360); // nothing wider than the phone
  await shot(page, 'bench-start-search');
  await axe(page);

  const label = `Q-${String(Date.now()).slice(-5)}`; // new on every run, so a kept e2e database does not refuse it as a duplicate
  await page.getByLabel('Find a machine').fill(label.toLowerCase());
  await expect(page.getByText(`No machine matches "${label.toLowerCase()}".`)).toBeVisible();
  await page.getByRole('button', { name: 'Add a machine' }).click();
  await expect(page.getByLabel('Label')).toHaveValue(label);
  await page.getByLabel('Model').fill('Badger 110 youth quad');
  await shot(page, 'bench-start-add');
  await page.getByRole('button', { name: 'Add this machine' }).click();
  await expect(page.getByRole('radio', { name: new RegExp(`^${label} Badger`) })).toBeChecked();
  await expect(page.getByText('never diagnosed').first()).toBeVisible();
});

test('a Bench screen that fails to draw shows what happened and a way back, not a blank page', async ({ page }) => {
  await signIn(page, 'tech');
  // a server answer the screen cannot draw (the procedure list is not a list)
  await page.route('**/api/bench/procedures', (route) => route.fulfill({ status: 200, contentType: 'application/json', body: '{"unexpected":true}' }));
  await page.goto('/bench/start');
  await expect(page.getByRole('alert').getByText('This Bench screen could not be shown')).toBeVisible();
  await expect(page.getByRole('navigation', { name: 'Areas' })).toBeVisible(); // the shell still stands
  await shot(page, 'bench-error-boundary');
  await page.unroute('**/api/bench/procedures');
  await page.getByRole('link', { name: 'Back to Bench' }).click();
  await expect(page.getByRole('heading', { name: 'Bench' })).toBeVisible();
});


import { PNG } from 'pngjs';
import { test, expect, type Browser, type Page } from '@playwright/test';
import { signIn, shot, axe } from './helpers';

// Issue 13 part 1: an author puts a reference picture on a step and the version is published; a
// technician's phone keeps it with the version and shows it on the step without signal.

/** A 240×160 "connector sketch" drawn with pngjs: a dark housing with three coloured pins. */
function connectorSketch(): Buffer {
  const png = new PNG({ width: 240, height: 160 });
  const pins = [[60, [30, 160, 60]], [120, [230, 230, 230]], [180, [220, 50, 40]]] as const;
  for (let y = 0; y < 160; y++) {
    for (let x = 0; x < 240; x++) {
      const pin = pins.find(([cx]) => Math.abs(x - cx) < 18 && Math.abs(y - 80) < 30);
      const colour = pin ? pin[1] : x > 20 && x < 220 && y > 30 && y < 130 ? [40, 44, 52] : [245, 240, 228];
      png.data.set([...colour, 255], (y * 240 + x) * 4);
    }
  }
  return PNG.sync.write(png);
}

/** Writes through the API from the signed-in page (same session and CSRF as the app). */
async function api<T>(page: Page, method: 'POST' | 'PUT', url: string, body: unknown): Promise<T> {
  return page.evaluate(async ({ method, url, body }) => {
    const { token } = await (await fetch('/api/auth/csrf')).json() as { token: string };
    const res = await fetch(url, { method, headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token }, body: JSON.stringify(body) });
    if (!res.ok) throw new Error(`${url}: ${res.status} ${await res.text()}`);
    return res.json();
  }, { method, url, body }) as Promise<T>;
}

const TITLE = `Pulser lead check ${Date.now()}`;
const CAPTION = 'Pulser connector from the wire side: back-probe the white pin';

/** A sound two-step procedure: back-probe (a Task) then a Finding. */
const document = (title: string) => ({
  schemaVersion: 2,
  meta: { title, symptom: 'No spark, pulser suspected', ignitionSystem: 'magneto-cdi', limitsNote: "Illustrative only: the manufacturer's service data and local regulations come first." },
  start: 'backProbe',
  steps: [
    { id: 'backProbe', kind: 'task', title: 'Back-probe the pulser lead', instructions: 'Engine off. Slide the probe into the back of the white pin.', next: 'pulserFound', position: { x: 0, y: 0 } },
    { id: 'pulserFound', kind: 'finding', title: 'Pulser circuit found', cause: 'Pulser lead located', repair: 'Continue with the pulser resistance check', position: { x: 0, y: 220 } },
  ],
});

async function leadPublishes(browser: Browser, url: string): Promise<void> {
  const context = await browser.newContext();
  const lead = await context.newPage();
  await signIn(lead, 'lead');
  await api(lead, 'POST', `${url}/publish`, {});
  await context.close();
}

/** How many pictures the phone keeps in IndexedDB. */
const keptPictures = (page: Page) => page.evaluate(() => new Promise<number>((resolve) => {
  const open = indexedDB.open('sparkwright-bench');
  open.onsuccess = () => {
    const db = open.result;
    if (!db.objectStoreNames.contains('pictures')) { db.close(); resolve(0); return; }
    const n = db.transaction('pictures').objectStore('pictures').count();
    n.onsuccess = () => { db.close(); resolve(n.result); };
  };
}));

test('an author adds a picture to a step and it is published; a phone shows it on the step without signal after a reload', async ({ browser }) => {
  test.setTimeout(180_000);
  // The author, on a big screen.
  const desk = await browser.newContext({ viewport: { width: 1600, height: 1000 } });
  const author = await desk.newPage();
  await signIn(author, 'author');
  const created = await api<{ procedureId: string; draftId: string }>(author, 'POST', '/api/procedures', { meta: { title: TITLE, symptom: 'No spark, pulser suspected', ignitionSystem: 'magneto-cdi' } });
  const versionUrl = `/api/procedures/${created.procedureId}/versions/${created.draftId}`;
  await api(author, 'PUT', versionUrl, { document: document(TITLE), lockVersion: 1 });
  await author.goto(`/drafting/${created.procedureId}/versions/${created.draftId}`);
  await author.locator('.react-flow__node[data-id="backProbe"]').click();
  const editor = author.getByTestId('pictures-editor');
  await editor.getByLabel('Add pictures to this step').setInputFiles({ name: 'pulser-connector.png', mimeType: 'image/png', buffer: connectorSketch() });
  await expect(editor.getByRole('button', { name: 'Attach' })).toBeDisabled(); // a caption first
  await editor.getByLabel('Caption for pulser-connector.png').fill(CAPTION);
  await editor.getByRole('button', { name: 'Attach' }).click();
  await expect(editor.getByTestId('step-picture')).toHaveCount(1);
  await expect(editor.getByRole('img', { name: CAPTION })).toHaveJSProperty('complete', true);
  await expect(author.getByTestId('save-status')).toContainText('Saved', { timeout: 15_000 });
  await shot(author, 'pictures-editor');
  await axe(author);
  await api(author, 'POST', `${versionUrl}/submit`, {});
  await desk.close();
  await leadPublishes(browser, versionUrl);

  // The technician, on a phone with signal: the start page keeps the version and its picture.
  const phone = await browser.newContext({ viewport: { width: 360, height: 780 }, hasTouch: true });
  const page = await phone.newPage();
  await signIn(page, 'tech');
  await page.evaluate(async () => { await navigator.serviceWorker.ready; });
  await page.goto('/bench/start');
  await expect(page.getByRole('radio', { name: new RegExp(TITLE) })).toBeVisible();
  await expect.poll(() => keptPictures(page), { timeout: 20_000 }).toBeGreaterThanOrEqual(1);
  await page.reload(); // the kit's size is read when the page opens
  await expect(page.getByTestId('kit-size')).toContainText(/with \d+ pictures?, [\d.]+ MB/);
  await shot(page, 'bench-start-kit-size');
  await page.getByRole('radio', { name: new RegExp(TITLE) }).check();
  await page.getByLabel('Find a machine').fill('W-03');
  await page.getByRole('radio', { name: /^W-03/ }).first().check();
  await page.getByLabel("Complaint in the customer's words").fill('No spark after a wash');
  await page.getByRole('button', { name: 'Start the diagnosis' }).click();
  await expect(page).toHaveURL(/\/bench\/d\/[0-9a-f-]{36}$/);
  await expect(page.getByRole('heading', { name: 'Back-probe the pulser lead' })).toBeVisible();

  // No signal, and a reload: the app from the service worker, the step and its picture from the phone.
  await phone.setOffline(true);
  await page.route('**/api/**', (route) => route.abort('internetdisconnected'));
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Back-probe the pulser lead' })).toBeVisible();
  const picture = page.getByTestId('bench-picture').getByRole('img', { name: CAPTION });
  await expect(picture).toBeVisible();
  await expect(picture).toHaveAttribute('src', /^blob:/);
  await expect.poll(() => picture.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(240);
  await expect(page.getByText(CAPTION)).toBeVisible();
  await shot(page, 'bench-picture-offline');
  await axe(page);
  await page.getByRole('button', { name: `Zoom: ${CAPTION}` }).click();
  const zoom = page.getByTestId('picture-zoom');
  await expect(zoom.getByRole('img', { name: CAPTION })).toBeVisible();
  await zoom.getByRole('button', { name: 'Zoom in' }).click();
  await shot(page, 'bench-picture-zoom');
  await zoom.getByRole('button', { name: 'Close' }).click();
  await expect(zoom).toHaveCount(0);
  await phone.close();
});

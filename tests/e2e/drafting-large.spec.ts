import { test, expect, type Page } from '@playwright/test';
import type { ProcedureDocument } from '@shared/schema';
import { signIn, shot } from './helpers';
import { soundProcedure } from '../shared/generate';

// An author on a big screen working in a 1 000-step procedure: only the steps in view are in the
// page, yet selecting, dragging and connecting work as on a small one, and what they did is saved.

test.use({ viewport: { width: 1600, height: 1000 } });

const STEPS = 1000;

/** The generated procedure laid out so that no two steps overlap: four steps around the start, the rest in rows below. */
function laidOut(): ProcedureDocument {
  const doc = soundProcedure(STEPS);
  const steps = doc.steps.map((s, i) => ({
    ...s,
    position: i < 4 ? { x: (i % 2) * 640, y: Math.floor(i / 2) * 300 } : { x: ((i - 4) % 8) * 640, y: 1200 + Math.floor((i - 4) / 8) * 260 },
  }));
  return { ...doc, steps };
}

async function apiCall<T>(page: Page, method: 'GET' | 'POST', url: string, body?: unknown): Promise<T> {
  return page.evaluate(async ({ method, url, body }) => {
    const { token } = await (await fetch('/api/auth/csrf')).json() as { token: string };
    const res = await fetch(url, { method, headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token }, ...(body === undefined ? {} : { body: JSON.stringify(body) }) });
    if (!res.ok) throw new Error(`${url}: ${res.status} ${await res.text()}`);
    return res.json();
  }, { method, url, body }) as Promise<T>;
}

const node = (page: Page, id: string) => page.locator(`.react-flow__node[data-id="${id}"]`);

test('an author selects, drags and connects steps on a 1 000-step procedure, and the draft saves what they did', async ({ page }) => {
  test.setTimeout(120_000);
  await signIn(page, 'author');
  const doc = laidOut();
  const title = `Large generated procedure ${Date.now()}`;
  const created = await apiCall<{ procedureId: string; draftId: string }>(page, 'POST', '/api/procedures/import', { file: doc, title });
  await page.goto('/drafting');
  await page.getByRole('link', { name: title }).click();
  await expect(node(page, 's0')).toBeVisible({ timeout: 30_000 });
  // React Flow holds every step (the overview map draws them all) but puts only those in view in the page
  await expect(page.locator('.react-flow__minimap-node')).toHaveCount(STEPS);
  expect(await page.locator('.react-flow__node').count()).toBeLessThan(STEPS / 4);

  // select
  await node(page, 's1').click({ position: { x: 20, y: 30 } });
  await expect(node(page, 's1')).toHaveClass(/selected/);
  await expect(page.getByRole('tab', { name: 'Step' })).toHaveAttribute('aria-selected', 'true');

  // drag: a step moves by what the mouse moved, at the canvas's zoom
  const before = (await node(page, 's3').boundingBox())!;
  await page.mouse.move(before.x + 16, before.y + 30);
  await page.mouse.down();
  await page.mouse.move(before.x + 20, before.y + 34);
  await page.mouse.move(before.x + 116, before.y + 90, { steps: 8 });
  await page.mouse.up();
  const after = (await node(page, 's3').boundingBox())!;
  expect(Math.abs(after.x - before.x - 100)).toBeLessThan(8);
  expect(Math.abs(after.y - before.y - 60)).toBeLessThan(8);

  // connect: the first band of the start step, dragged onto step s3's input
  const s0 = doc.steps[0]!;
  if (s0.kind !== 'reading') throw new Error('the generator starts with a Reading');
  const band = s0.bands[0]!;
  expect(band.next).not.toBe('s3');
  const source = (await page.getByTestId(`handle-s0-band:${band.id}`).boundingBox())!;
  const target = (await node(page, 's3').locator('.react-flow__handle.target').boundingBox())!;
  await page.mouse.move(source.x + source.width / 2, source.y + source.height / 2);
  await page.mouse.down();
  await page.mouse.move(source.x + source.width / 2 + 4, source.y + source.height / 2 + 4);
  await page.mouse.move(target.x + target.width / 2, target.y + target.height / 2, { steps: 12 });
  await page.mouse.up();
  await shot(page, 'drafting-large-procedure');

  // the draft saves on its own after a few idle seconds; the server then has the branch and the move
  const url = `/api/procedures/${created.procedureId}/versions/${created.draftId}`;
  const savedStep = async (id: string) => (await apiCall<{ document: ProcedureDocument }>(page, 'GET', url)).document.steps.find((s) => s.id === id)!;
  await expect.poll(async () => { const s = await savedStep('s0'); return s.kind === 'reading' ? s.bands[0]!.next : null; }, { timeout: 20_000 }).toBe('s3');
  expect((await savedStep('s3')).position).not.toEqual(doc.steps[3]!.position);
});

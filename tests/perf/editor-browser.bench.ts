// npm run perf:editor-browser: the editor in Debian's Chromium against the built app with its own
// throwaway database (scripts/perf.sh). For 36, 300 and 1 000-step procedures imported through
// the API (soundProcedure), it opens each from the Drafting list, pans for one second, zooms for
// one second and adds one step, and prints: click to every visible step drawn, frames per second
// while panning and zooming (with the longest frame), and add to the new soundness count shown.
// Figures only: nothing here passes or fails on speed.
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { chromium, type Page } from '@playwright/test';
import { soundProcedure } from '../shared/generate';
import { DEMO_PASSWORD } from '../e2e/helpers';

const SIZES = (process.env.EDITOR_BENCH_SIZES ?? '36,300,1000').split(',').map(Number);
const RUNS = Number(process.env.EDITOR_BENCH_RUNS ?? 3);
const LAUNCH_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

const OPEN_TIMEOUT_MS = 60_000;
const EDIT_TIMEOUT_MS = 60_000;

/** Progress to stderr, so a slow stage shows where it is; the table stays alone on stdout. */
const started = Date.now();
const progress = (what: string) => process.stderr.write(`[editor-bench ${((Date.now() - started) / 1000).toFixed(1)} s] ${what}\n`);

/** Every wait in here ends: `what` names the stage in the error when it does not finish in `ms`. */
async function within<T>(what: string, ms: number, p: Promise<T>): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const limit = new Promise<never>((_, reject) => { timer = setTimeout(() => reject(new Error(`${what}: no answer in ${ms / 1000} s`)), ms); });
  try { return await Promise.race([p, limit]); } finally { clearTimeout(timer); }
}

const freePort = () => new Promise<number>((resolve, reject) => {
  const s = createServer();
  s.once('error', reject);
  s.listen(0, '127.0.0.1', () => { const { port } = s.address() as { port: number }; s.close(() => resolve(port)); });
});

async function startApp(port: number): Promise<ChildProcess> {
  const child = spawn('node', ['--import', 'tsx', 'server/index.ts'], {
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env, NODE_ENV: 'test', PORT: String(port), HOST: '127.0.0.1', APP_URL: `http://localhost:${port}`,
      DATA_DIR: '.tmp/perf-editor-data', DEMO_PASSWORD, DEMO_HISTORY: '0', LOGIN_RATE_LIMIT: '500', SERVE_CLIENT: '1', LOCAL_FAKES: '1',
    },
  });
  let log = '';
  child.stdout!.on('data', (d: Buffer) => { log += d.toString(); });
  child.stderr!.on('data', (d: Buffer) => { log += d.toString(); });
  for (let i = 0; i < 240; i++) {
    if (child.exitCode !== null) throw new Error(`the app stopped:\n${log}`);
    try { if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) return child; } catch { /* not up yet */ }
    await new Promise((r) => setTimeout(r, 500));
  }
  child.kill('SIGTERM');
  throw new Error(`the app did not answer on ${port}:\n${log}`);
}

async function importProcedure(page: Page, n: number): Promise<string> {
  const title = `Bench ${n} steps ${Date.now()}`;
  await page.evaluate(async ({ file, title }) => {
    const { token } = await (await fetch('/api/auth/csrf')).json() as { token: string };
    const res = await fetch('/api/procedures/import', { method: 'POST', headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token }, body: JSON.stringify({ file, title }) });
    if (!res.ok) throw new Error(`import: ${res.status} ${await res.text()}`);
  }, { file: soundProcedure(n), title });
  return title;
}

/**
 * Clicks the list's link and times, on the page's clock, until the canvas shows its steps: every
 * node React Flow has put in the page is measured (visible) and the set stays the same for two frames.
 */
async function timeOpen(page: Page, title: string): Promise<number> {
  progress(`open "${title}": the Drafting list`);
  await page.goto('/drafting');
  const link = page.getByRole('link', { name: title });
  await link.waitFor();
  await page.waitForResponse((r) => /\/assets\/editor-page-[^/]+\.js$/.test(r.url()), { timeout: 5000 }).catch(() => undefined);
  await page.evaluate((limitMs) => {
    const w = window as unknown as { __opened: Promise<number> };
    w.__opened = new Promise<number>((resolve, reject) => {
      document.addEventListener('click', () => {
        const t0 = performance.now();
        let last = '';
        let stable = 0;
        let firstStable = 0;
        let state = 'no step in the page yet';
        const tick = () => {
          const nodes = [...document.querySelectorAll<HTMLElement>('.react-flow__node')];
          const unseen = nodes.filter((n) => n.style.visibility === 'hidden' || n.offsetWidth === 0).length;
          const drawn = nodes.length > 0 && unseen === 0;
          const key = drawn ? `${nodes.length}:${document.querySelector('.react-flow__viewport')?.getAttribute('style') ?? ''}` : '';
          if (drawn && key === last) { stable += 1; } else { stable = 0; firstStable = performance.now(); }
          last = key;
          state = `${nodes.length} steps in the page, ${unseen} hidden or unmeasured; view ${document.querySelector('.react-flow__viewport')?.getAttribute('style') ?? 'absent'}; at ${location.pathname}`;
          if (stable >= 2) resolve(firstStable - t0);
          else if (performance.now() - t0 > limitMs) reject(new Error(`the steps were not drawn in ${limitMs / 1000} s: ${state}`));
          else requestAnimationFrame(tick);
        };
        requestAnimationFrame(tick);
      }, { capture: true, once: true });
    });
  }, OPEN_TIMEOUT_MS);
  progress('open: click');
  await link.click();
  const ms = await within('open: waiting in the page for the steps drawn', OPEN_TIMEOUT_MS + 10_000,
    page.evaluate(() => (window as unknown as { __opened: Promise<number> }).__opened));
  progress(`open: drawn in ${ms.toFixed(0)} ms`);
  return ms;
}

/** Counts animation frames while `act` runs; returns frames per second and the longest frame. */
async function frames(page: Page, act: () => Promise<void>): Promise<{ fps: number; longestMs: number }> {
  await page.evaluate(() => {
    const w = window as unknown as { __frames: number[]; __counting: boolean };
    w.__frames = []; w.__counting = true;
    const tick = (t: number) => { w.__frames.push(t); if (w.__counting) requestAnimationFrame(tick); };
    requestAnimationFrame(tick);
  });
  await within('pan/zoom', 30_000, act());
  const ts = await page.evaluate(() => { const w = window as unknown as { __frames: number[]; __counting: boolean }; w.__counting = false; return w.__frames; });
  const span = ts[ts.length - 1]! - ts[0]!;
  let longest = 0;
  for (let i = 1; i < ts.length; i++) longest = Math.max(longest, ts[i]! - ts[i - 1]!);
  return { fps: ((ts.length - 1) * 1000) / span, longestMs: longest };
}

async function canvasCentre(page: Page): Promise<{ x: number; y: number }> {
  const b = (await page.getByTestId('canvas').boundingBox())!;
  return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
}

/** Space held, the mouse drags the view (over steps too) back and forth for a second. */
async function pan(page: Page): Promise<void> {
  const c = await canvasCentre(page);
  await page.keyboard.down('Space');
  await page.mouse.move(c.x, c.y);
  await page.mouse.down();
  const t0 = Date.now();
  for (let i = 0; Date.now() - t0 < 1000; i++) {
    const phase = (i % 120) / 120;
    const dx = (phase < 0.5 ? phase : 1 - phase) * 2 * 900 - 450;
    await page.mouse.move(c.x + dx, c.y + dx / 3);
  }
  await page.mouse.up();
  await page.keyboard.up('Space');
}

async function zoom(page: Page): Promise<void> {
  const c = await canvasCentre(page);
  await page.mouse.move(c.x, c.y);
  const t0 = Date.now();
  for (let i = 0; Date.now() - t0 < 1000; i++) await page.mouse.wheel(0, i % 40 < 20 ? 60 : -60);
}

/** Adds a Finding from the palette (an unreachable step: one more error) and times until the count shows it. */
async function timeEdit(page: Page): Promise<{ ms: number; longestMs: number }> {
  progress('edit: add a Finding');
  const counts = page.getByTestId('lint-counts');
  await counts.waitFor();
  await page.evaluate((limitMs) => {
    const w = window as unknown as { __edited: Promise<{ ms: number; longestMs: number }> };
    const el = document.querySelector('[data-testid="lint-counts"]')!;
    const before = el.textContent;
    w.__edited = new Promise((resolve, reject) => {
      document.addEventListener('click', () => {
        const t0 = performance.now();
        let prev = t0;
        let longest = 0;
        const tick = (t: number) => {
          longest = Math.max(longest, t - prev); prev = t;
          if (el.isConnected && el.textContent !== before) resolve({ ms: performance.now() - t0, longestMs: longest });
          else if (performance.now() - t0 > limitMs) reject(new Error(`the soundness count did not change in ${limitMs / 1000} s: still "${before}", counts ${el.isConnected ? 'in the page' : 'replaced'}`));
          else requestAnimationFrame(tick);
        };
        requestAnimationFrame(tick);
      }, { capture: true, once: true });
    });
  }, EDIT_TIMEOUT_MS);
  await page.getByTestId('palette-finding').click();
  const r = await within('edit: waiting in the page for the new soundness count', EDIT_TIMEOUT_MS + 10_000,
    page.evaluate(() => (window as unknown as { __edited: Promise<{ ms: number; longestMs: number }> }).__edited));
  progress(`edit: count shown in ${r.ms.toFixed(0)} ms`);
  return r;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const f0 = (x: number) => x.toFixed(0).padStart(5);

async function main(): Promise<void> {
  const port = await freePort();
  progress(`starting the app on ${port}`);
  const app = await startApp(port);
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: LAUNCH_ARGS });
  try {
    const page = await browser.newPage({ viewport: { width: 1440, height: 900 }, baseURL: `http://localhost:${port}` });
    page.setDefaultTimeout(30_000);
    // tsx compiles this file keeping function names: a named function inside a page.evaluate callback
    // becomes __name(fn, 'fn'), which the page lacks. Without this the click handlers below threw
    // ("__name is not defined") and their promises never settled: the run hung after the header.
    await page.addInitScript('globalThis.__name = (fn) => fn;');
    page.on('dialog', (d) => { progress(`a ${d.type()} dialog: "${d.message()}", accepted`); void d.accept(); });
    page.on('pageerror', (e) => progress(`page error: ${e.message}`));
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').fill('author@larkspur.test');
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('navigation', { name: 'Areas' }).waitFor();
    console.log(`Chromium ${browser.version()} at 1440 x 900; ${RUNS} runs per size, medians (longest frame in brackets)`);
    console.log('steps   open ms   pan fps (longest ms)   zoom fps (longest ms)   add→soundness ms (longest frame ms)');
    for (const n of SIZES) {
      progress(`import ${n} steps`);
      const title = await within(`import of ${n} steps`, 120_000, importProcedure(page, n));
      const r = { open: [] as number[], pan: [] as number[], panLong: [] as number[], zoom: [] as number[], zoomLong: [] as number[], edit: [] as number[], editLong: [] as number[] };
      for (let run = 0; run < RUNS; run++) {
        r.open.push(await timeOpen(page, title));
        await page.waitForTimeout(500); // the check that follows the first paint
        progress('pan');
        const p = await frames(page, () => pan(page));
        r.pan.push(p.fps); r.panLong.push(p.longestMs);
        progress('zoom');
        const z = await frames(page, () => zoom(page));
        r.zoom.push(z.fps); r.zoomLong.push(z.longestMs);
        await page.waitForTimeout(300);
        const e = await timeEdit(page);
        r.edit.push(e.ms); r.editLong.push(e.longestMs);
      }
      console.log(`${String(n).padStart(5)}   ${f0(median(r.open))}     ${f0(median(r.pan))} (${f0(median(r.panLong))})           ${f0(median(r.zoom))} (${f0(median(r.zoomLong))})            ${f0(median(r.edit))} (${f0(median(r.editLong))})`);
      console.log(`        runs: open ${r.open.map((x) => x.toFixed(0)).join(', ')} ms; add→soundness ${r.edit.map((x) => x.toFixed(0)).join(', ')} ms`);
    }
  } finally {
    await browser.close();
    app.kill('SIGTERM');
  }
}

await main();

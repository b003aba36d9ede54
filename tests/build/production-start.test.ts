import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startFakeS3, type FakeS3 } from '../../server/dev/fake-s3';
import { startFakeSmtp, type FakeSmtp } from '../../server/dev/fake-smtp';

// A production start as DEVELOPERS.md describes it: the build output (dist/, dist-server/) with
// package.json and the lock in a fresh folder, `npm ci --omit=dev` (from the npm cache), then
// `node dist-server/index.js` with LOCAL_FAKES=0 against a database. Mail and photos go to
// servers outside the process, as in production: here the fakes, started by this test.
// scripts/test.sh sets PROD_DATABASE_URL for the build tests; the test compiles the server itself.
const url = process.env.PROD_DATABASE_URL;
let dir = '';
let server: ChildProcess | undefined;
let output = '';
let s3: FakeS3;
let smtp: FakeSmtp;

const freePort = () => new Promise<number>((resolve) => {
  const s = createServer().listen(0, '127.0.0.1', () => {
    const { port } = s.address() as { port: number };
    s.close(() => resolve(port));
  });
});

beforeAll(async () => {
  if (!url) throw new Error('Set PROD_DATABASE_URL (scripts/test.sh does) to a database the production start may migrate and seed.');
  execFileSync('node', ['scripts/build-server.mjs'], { stdio: 'inherit' });
  // Outside the repository, so that Node cannot find a package in the repository's node_modules.
  dir = mkdtempSync(path.join(tmpdir(), 'sparkwright-prod-'));
  for (const f of ['package.json', 'package-lock.json', 'dist-server', ...(existsSync('dist') ? ['dist'] : [])]) cpSync(f, path.join(dir, f), { recursive: true });
  execFileSync('npm', ['ci', '--omit=dev', '--prefer-offline', '--no-audit', '--no-fund', '--loglevel=error'], { cwd: dir, stdio: 'inherit' });
  [s3, smtp] = await Promise.all([startFakeS3({ dir: path.join(dir, 's3'), bucket: 'sparkwright-photos' }), startFakeSmtp()]);
}, 180_000);

afterAll(async () => {
  if (server && server.exitCode === null) {
    server.kill('SIGTERM');
    await new Promise((resolve) => server!.once('exit', resolve));
  }
  await Promise.all([s3?.close(), smtp?.close()]);
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('a production start without dev packages', () => {
  it('the install has none of the dev-only packages, and the compiled server starts with LOCAL_FAKES=0 and answers /api/health', async () => {
    for (const dev of ['tsx', 'smtp-server', 's3rver', 'vite', 'typescript']) expect([dev, existsSync(path.join(dir, 'node_modules', dev))]).toEqual([dev, false]);
    const port = await freePort();
    server = spawn('node', ['--enable-source-maps', 'dist-server/index.js'], {
      cwd: dir,
      env: {
        PATH: process.env.PATH, NODE_ENV: 'production', DATABASE_URL: url, PORT: String(port), HOST: '127.0.0.1', LOCAL_FAKES: '0',
        S3_ENDPOINT: s3.endpoint, SMTP_PORT: String(smtp.port), DEMO_HISTORY: '0', DATA_DIR: path.join(dir, 'data'),
        SESSION_SECRET: 'a-long-random-value-for-this-test-only', AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    server.stdout!.on('data', (b: Buffer) => { output += b.toString(); });
    server.stderr!.on('data', (b: Buffer) => { output += b.toString(); });
    let health: { status: number; body: unknown } | null = null;
    for (let i = 0; i < 120 && !health && server.exitCode === null; i++) {
      await new Promise((r) => setTimeout(r, 250));
      health = await fetch(`http://127.0.0.1:${port}/api/health`).then(async (r) => ({ status: r.status, body: await r.json() }), () => null);
    }
    expect(health, `the server did not answer; its output:\n${output}`).toMatchObject({ status: 200, body: { ok: true, db: 'up', replica: { state: 'none', debriefReadsFrom: 'primary' } } });
    expect(output).toContain('Sparkwright is up');
    expect(output).not.toContain('local object store');
  }, 60_000);
});

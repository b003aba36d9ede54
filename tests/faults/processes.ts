import { execFile, spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { createMigrator, createSequelize } from '../../server/db';

// Real app servers (`server/index.ts`, one OS process each) on a PostgreSQL cluster of their own
// under .tmp/, so that a test may stop and start that database without touching anyone else's.

const run = promisify(execFile);
const root = path.resolve(import.meta.dirname, '../..');

export const FAULTS_PASSWORD = 'spark-faults-test-pw';

export interface Database {
  url: string;
  /** Stops PostgreSQL (fast shutdown: open connections are cut, as in a crash or a failover). */
  stop(): Promise<void>;
  start(): Promise<void>;
  /** Stops it and deletes the cluster. */
  remove(): Promise<void>;
}

const pgScript = (cmd: string, env: Record<string, string>) =>
  run('bash', ['scripts/pg.sh', cmd, '--throwaway'], { cwd: root, env: { ...process.env, ...env } });

/** A throwaway cluster in .tmp/pg-<name>, created afresh and migrated. */
export async function throwawayDatabase(name: string): Promise<Database> {
  const env = { PG_ROOT: path.join(root, '.tmp', `pg-${name}`), APP_DB: `sparkwright_${name.replace(/\W/g, '_')}`, PG_PORT: String(await freePort()) };
  await pgScript('reset', env);
  const url = (await pgScript('start', env)).stdout.trim();
  const sequelize = createSequelize(url);
  await createMigrator(sequelize).up();
  await sequelize.close();
  return {
    url,
    stop: async () => { await pgScript('stop', env); },
    start: async () => { await pgScript('start', env); },
    remove: async () => { await pgScript('reset', env); },
  };
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

export interface AppProcess {
  base: string;
  child: ChildProcess;
  /** Everything the process wrote, for a failing test to show. */
  output(): string;
  /** null while it runs; its exit code (or signal) once it ended. */
  exited(): number | string | null;
  stop(): Promise<void>;
}

const started = new Set<ChildProcess>();
process.once('exit', () => { for (const c of started) c.kill('SIGKILL'); });

/**
 * Starts `server/index.ts` as its own process on a free port (migrations, demo shop, listen) and
 * resolves once /api/health answers. Start servers on one database one after the other: the
 * first one migrates and seeds, the next find it done.
 */
export async function startAppProcess(databaseUrl: string, env: Record<string, string> = {}): Promise<AppProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: {
      ...process.env, NODE_ENV: 'test', PORT: String(port), HOST: '127.0.0.1', DATABASE_URL: databaseUrl,
      SERVE_CLIENT: '0', LOCAL_FAKES: '1', SMTP_PORT: '0', DEMO_HISTORY: '0', DEMO_PASSWORD: FAULTS_PASSWORD,
      DATA_DIR: mkdtempSync(path.join(tmpdir(), 'sw-faults-')), LOGIN_RATE_LIMIT: '1000',
      AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true', ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  started.add(child);
  let output = '';
  child.stdout!.on('data', (d: Buffer) => { output += d.toString(); });
  child.stderr!.on('data', (d: Buffer) => { output += d.toString(); });
  let exit: number | string | null = null;
  const ended = new Promise<void>((resolve) => child.once('exit', (code, signal) => { exit = code ?? signal; started.delete(child); resolve(); }));
  const base = `http://127.0.0.1:${port}`;
  for (let i = 0; ; i++) {
    if (exit !== null) throw new Error(`the app server exited (${exit}) before it was up:\n${output}`);
    if (i > 600) { child.kill('SIGKILL'); throw new Error(`the app server was not up after 60 s:\n${output}`); }
    const ok = await fetch(`${base}/api/health`).then((r) => r.ok, () => false);
    if (ok) break;
    await sleep(100);
  }
  return {
    base, child,
    output: () => output,
    exited: () => exit,
    async stop() {
      if (exit !== null) return;
      child.kill('SIGTERM');
      await Promise.race([ended, sleep(10_000)]);
      if (exit === null) child.kill('SIGKILL');
    },
  };
}

export const sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms));

import { randomUUID } from 'node:crypto';
import { createSequelize } from '../../server/db';
import { initModels, Meter, Procedure, ProcedureVersion, Shop, Vehicle } from '../../server/models';
import { doc, ohmsReading } from '../shared/fixtures';
import type { DiagnosisStepBody, StartDiagnosisBody } from '@shared/schema/bench';
import { FAULTS_PASSWORD } from './processes';

// A signed-in member talking to real app servers over HTTP (fetch), and a procedure whose one
// Reading comes back to itself, so that a diagnosis can take as many valid steps as a test needs.

export interface Answer { status: number; body: Record<string, unknown>; headers: Headers; ms: number }

const realFetch = globalThis.fetch;

/** One session cookie, usable on any app server of the same database (as behind a balancer). */
export class Session {
  private constructor(public cookie: string, public csrf: string) {}

  /** A visitor with a session cookie and its CSRF token but no sign-in (forgot password, reset). */
  static async anonymous(base: string): Promise<Session> {
    const first = await realFetch(`${base}/api/auth/csrf`);
    if (first.status !== 200) throw new Error(`the CSRF token could not be fetched: ${first.status}`);
    return new Session(first.headers.get('set-cookie')!.split(';')[0]!, ((await first.json()) as { token: string }).token);
  }

  static async signIn(base: string, email: string, password = FAULTS_PASSWORD): Promise<Session> {
    const first = await realFetch(`${base}/api/auth/csrf`);
    if (first.status !== 200) throw new Error(`sign-in of ${email} failed: ${first.status} ${await first.text()}`);
    const cookie0 = first.headers.get('set-cookie')!.split(';')[0]!;
    const { token } = (await first.json()) as { token: string };
    const login = await realFetch(`${base}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json', cookie: cookie0, 'x-csrf-token': token },
      body: JSON.stringify({ email, password }),
    });
    if (login.status !== 200) throw new Error(`sign-in of ${email} failed: ${login.status} ${await login.text()}`);
    return new Session(login.headers.get('set-cookie')!.split(';')[0]!, ((await login.json()) as { csrfToken: string }).csrfToken);
  }

  get(base: string, path: string, timeoutMs = 10_000): Promise<Answer> {
    return this.send(base, 'GET', path, undefined, timeoutMs);
  }
  post(base: string, path: string, body: unknown = {}, timeoutMs = 10_000): Promise<Answer> {
    return this.send(base, 'POST', path, body, timeoutMs);
  }
  patch(base: string, path: string, body: unknown): Promise<Answer> {
    return this.send(base, 'PATCH', path, body, 10_000);
  }

  private async send(base: string, method: string, path: string, body: unknown, timeoutMs: number): Promise<Answer> {
    const t0 = performance.now();
    const res = await realFetch(`${base}${path}`, {
      method,
      headers: { cookie: this.cookie, ...(method === 'GET' ? {} : { 'content-type': 'application/json', 'x-csrf-token': this.csrf }) },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal: AbortSignal.timeout(timeoutMs),
    });
    const text = await res.text();
    return { status: res.status, body: parseBody(text), headers: res.headers, ms: performance.now() - t0 };
  }
}

function parseBody(text: string): Record<string, unknown> {
  try {
    return text ? (JSON.parse(text) as Record<string, unknown>) : {};
  } catch {
    return { text };
  }
}

/** Illustrative limits for a test, not service data: 100–200 Ω, every band back to the same step. */
const loopDoc = doc([ohmsReading('exciter', 100, 200, { low: 'exciter', ok: 'exciter', high: 'exciter' })]);

export interface LoopWorld { versionId: string; vehicleId: string; meterId: string }

/** Publishes the looping procedure in the demo shop of the database at `url` (already seeded by an app server). */
export async function publishLoopProcedure(url: string): Promise<LoopWorld> {
  const sequelize = createSequelize(url);
  initModels(sequelize);
  try {
    const shop = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!;
    const proc = await Procedure.create({ shopId: shop.id, slug: `faults-loop-${randomUUID().slice(0, 8)}`, title: 'Exciter loop', symptom: 'No spark', ignitionSystem: 'magneto-cdi', archivedAt: null, createdBy: null });
    const version = await ProcedureVersion.create({
      shopId: shop.id, procedureId: proc.id, number: 1, status: 'published', document: loopDoc as unknown as Record<string, unknown>,
      basedOnId: null, createdBy: null, updatedBy: null, publishedBy: null, publishedAt: new Date(), retiredAt: null,
    });
    const vehicle = (await Vehicle.findOne({ where: { shopId: shop.id } }))!;
    const meter = (await Meter.findOne({ where: { shopId: shop.id } }))!;
    return { versionId: version.id, vehicleId: vehicle.id, meterId: meter.id };
  } finally {
    await sequelize.close();
  }
}

export function startBody(w: LoopWorld, id = randomUUID()): StartDiagnosisBody {
  return {
    id, procedureVersionId: w.versionId, vehicleId: w.vehicleId, meterId: w.meterId,
    complaint: 'Cranks but will not fire', conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null },
    startedAt: new Date().toISOString(),
  };
}

/** One answer to the looping Reading, following `after` (null for the first). */
export function loopStep(after: string | null, entered = '0,15k', id: string = randomUUID()): DiagnosisStepBody & { note: string } {
  const now = new Date().toISOString();
  return { id, after, stepId: 'exciter', entered, note: '', startedAt: now, answeredAt: now };
}

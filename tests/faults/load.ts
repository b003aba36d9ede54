import { loopStep, startBody, Session, type Answer, type LoopWorld } from './bench-session';
import type { Phone } from './phone';
import { sleep } from './processes';

// Steady traffic for the outage check: readers re-read their diagnosis, writers step theirs, and
// the phone answers a step every 250 ms through its outbox. Every request is kept with its times.

export interface Sent { at: number; done: number; kind: 'read' | 'write'; answer: Answer | null; error?: string }

export interface Lane { s: Session; diagnosisId: string }

/** A technician signed in with a diagnosis of their own started. */
export async function startLane(base: string, world: LoopWorld): Promise<Lane> {
  const s = await Session.signIn(base, 'tech@larkspur.test');
  const start = startBody(world);
  const res = await s.post(base, '/api/diagnoses', start);
  if (res.status !== 201) throw new Error(`a diagnosis did not start: ${res.status} ${JSON.stringify(res.body)}`);
  return { s, diagnosisId: start.id };
}

export interface Load {
  sent: Sent[];
  /** ids of the steps answered 2xx */
  acknowledged: string[];
  stop(): Promise<void>;
}

export function startLoad(base: string, who: { readers: Lane[]; writers: Lane[]; phone: Phone }): Load {
  const sent: Sent[] = [];
  const acknowledged: string[] = [];
  let running = true;
  const record = async (kind: Sent['kind'], go: () => Promise<Answer>): Promise<Answer | null> => {
    const at = performance.now();
    try {
      const answer = await go();
      sent.push({ at, done: performance.now(), kind, answer });
      return answer;
    } catch (e) {
      sent.push({ at, done: performance.now(), kind, answer: null, error: (e as Error).message });
      return null;
    }
  };
  const reader = async (lane: Lane) => {
    while (running) {
      await record('read', () => lane.s.get(base, `/api/diagnoses/${lane.diagnosisId}`));
      await sleep(40);
    }
  };
  // A writer sends the same step again until it is acknowledged, as a phone would.
  const writer = async (lane: Lane) => {
    let body = loopStep(null);
    while (running) {
      const answer = await record('write', () => lane.s.post(base, `/api/diagnoses/${lane.diagnosisId}/steps`, body));
      if (answer && answer.status < 300) {
        acknowledged.push(body.id);
        body = loopStep(body.id);
      }
      await sleep(40);
    }
  };
  const phone = async () => {
    while (running) {
      await who.phone.answer();
      await sleep(250);
    }
  };
  const loops = [...who.readers.map(reader), ...who.writers.map(writer), phone()];
  return {
    sent,
    acknowledged,
    async stop() {
      running = false;
      await Promise.all(loops);
    },
  };
}

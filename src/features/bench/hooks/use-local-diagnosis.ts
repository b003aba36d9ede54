import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { flushSync } from 'react-dom';
import type { ProcedureDocument } from '@shared/schema/procedure';
import type { BranchCounts } from '@shared/engine/figures';
import type { EndingOutcome } from '@shared/schema/bench';
import { commitLocal, getLocalDiagnosis, getVersion, peekKept, type LocalDiagnosis, type LocalRow, type OutboxMessage } from '../../../lib/offline/db';
import { flushOutbox } from '../../../lib/offline/outbox';
import { afterFor, formulaRows, walkRows, withMeter, type Walked } from '../lib/walk-rows';
import { makeThumbnail } from '../lib/thumbnail';

/** What the step screen hands over for an answer: the step body without its ids and times (added here). */
export type Answer = Pick<LocalRow, 'stepId' | 'entered' | 'leadEntered' | 'answerId' | 'acknowledged' | 'acknowledgedAt' | 'note' | 'startedAt'>;

export interface LocalDiagnosisApi {
  loading: boolean;
  error: string | null;
  diagnosis: LocalDiagnosis | null;
  doc: ProcedureDocument | null;
  /** Recorded branch frequencies of the version in this shop (empty without history). */
  branchCounts: BranchCounts;
  walked: Walked | null;
  /** Answers the current step, or (with `index`) the step at that place on the path, going back. */
  answer(a: Answer, index?: number): Promise<void>;
  finish(stepId: string, outcome: EndingOutcome, note: string, startedAt: string): Promise<void>;
  addPhoto(file: File, stepId: string | null): Promise<void>;
}

/** The diagnosis this tab has just kept and its version, ready to draw without waiting for IndexedDB. */
function fromMemory(id: string) {
  const k = peekKept(id);
  return k ? { diagnosis: k.diagnosis, doc: withMeter(k.version.document as ProcedureDocument, k.diagnosis.meterEntries), branchCounts: k.version.branchCounts ?? {} } : null;
}

/**
 * Reads the diagnosis and its procedure version from the phone (no network). Just started or
 * answered in this tab, it is drawn at once from memory, then read again in case another tab
 * went on with it (a read never undoes an answer given here meanwhile).
 */
function useStoredDiagnosis(id: string) {
  const [first] = useState(() => fromMemory(id));
  const [diagnosis, setDiagnosis] = useState<LocalDiagnosis | null>(first?.diagnosis ?? null);
  const [doc, setDoc] = useState<ProcedureDocument | null>(first?.doc ?? null);
  const [branchCounts, setBranchCounts] = useState<BranchCounts>(first?.branchCounts ?? {});
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(first === null);
  useEffect(() => {
    let live = true;
    (async () => {
      const d = await getLocalDiagnosis(id);
      if (!d) throw new Error('This diagnosis is not on this phone. Open it from the Bench home, or start a new one.');
      if (first?.diagnosis.id === id) {
        if (live) setDiagnosis((shown) => (shown?.id === id && shown.rows.length >= d.rows.length ? shown : d));
        return;
      }
      const v = await getVersion(d.versionId);
      // The server sends the document already upgraded and parsed; checking it again here would
      // put the schema library into the phone's first download.
      if (!v) throw new Error('The procedure of this diagnosis is not on this phone. Connect once and open it again.');
      if (live) { setDiagnosis(d); setDoc(withMeter(v.document as ProcedureDocument, d.meterEntries)); setBranchCounts(v.branchCounts ?? {}); }
    })().catch((e: unknown) => live && setError(e instanceof Error ? e.message : String(e))).finally(() => live && setLoading(false));
    return () => { live = false; };
  }, [id, first]);
  return { diagnosis, setDiagnosis, doc, branchCounts, error, loading };
}

/** The row an answer becomes: a fresh client id, linked after the step it follows on the path. */
function answerRow(a: Answer, path: Walked['path'], at: number, now: string): LocalRow {
  return {
    id: crypto.randomUUID(), stepId: a.stepId, after: afterFor(path, at), note: a.note, startedAt: a.startedAt, answeredAt: now,
    ...(a.entered !== undefined ? { entered: a.entered } : {}), ...(a.leadEntered ? { leadEntered: a.leadEntered } : {}),
    ...(a.answerId !== undefined ? { answerId: a.answerId } : {}), ...(a.acknowledged ? { acknowledged: true, ...(a.acknowledgedAt ? { acknowledgedAt: a.acknowledgedAt } : {}) } : {}),
  };
}

/** The walk of rows an answer just made, so the step screen does not walk them again. */
const walkedFor = new WeakMap<readonly LocalRow[], Walked>();

/**
 * Runs `fn` once the frame with the next step has been painted: sending starts with IndexedDB
 * reads and a request, which would otherwise delay that frame on a slow phone.
 */
function afterNextPaint(fn: () => void): void {
  if (typeof requestAnimationFrame === 'undefined') { setTimeout(fn, 0); return; }
  requestAnimationFrame(() => setTimeout(fn, 0));
}

/**
 * A diagnosis read from and written to the phone; the outbox carries each change to the server.
 *
 * An answer shows the next step in the task of the tap: the write's transaction is opened and all
 * its requests handed to IndexedDB first, in that same task, so the answer is on its way to the
 * phone's storage before the step changes and survives a reload right after the tap
 * (tests/e2e/bench-durable.spec.ts). Should the write fail, the screen goes back to the step
 * before it and says why; an answer tapped while a write is still being kept waits for it, so an
 * answer never lands on a step whose own answer the phone refused.
 */
export function useLocalDiagnosis(id: string): LocalDiagnosisApi {
  const { diagnosis, setDiagnosis, doc, branchCounts, error, loading } = useStoredDiagnosis(id);
  const walked = useMemo(() => (doc && diagnosis ? walkedFor.get(diagnosis.rows) ?? walkRows(doc, diagnosis.rows) : null), [doc, diagnosis]);
  /** The write still being kept, if any: resolves true once kept, false when the phone refused it. */
  const keeping = useRef<Promise<boolean> | null>(null);

  const save = useCallback((before: LocalDiagnosis, next: LocalDiagnosis, messages: OutboxMessage[]): Promise<void> => {
    performance.mark('bench:keep');
    const kept = commitLocal(next, messages); // every request issued, in this task
    // Drawn now, in this task: the next step is the only thing to do now. Updates the caller queued
    // before (the screen leaving "change an earlier answer") are drawn in the same render.
    flushSync(() => setDiagnosis(next));
    const settled = kept.then(() => true, () => false);
    keeping.current = settled;
    void settled.then(() => { if (keeping.current === settled) keeping.current = null; });
    return kept.then(() => {
      performance.mark('bench:kept');
      afterNextPaint(() => void flushOutbox());
    }, (e: unknown) => {
      setDiagnosis(before); // not kept: back to the step, with the storage problem on screen
      throw e;
    });
  }, [setDiagnosis]);

  const answer = useCallback(async (a: Answer, index?: number) => {
    if (!doc || !diagnosis || !walked) return;
    // Only while the last write is still being kept (a few ms): a refused one puts its step back.
    if (keeping.current && !(await keeping.current)) return;
    const now = new Date().toISOString();
    const row = answerRow(a, walked.path, index ?? walked.path.length, now);
    const rows = [...diagnosis.rows, row];
    const onward = walkRows(doc, rows, walked);
    const computed = formulaRows(doc, rows, now, onward);
    const all = [...rows, ...computed];
    walkedFor.set(all, walkRows(doc, all, onward)); // the screen draws it without walking again
    await save(diagnosis, { ...diagnosis, rows: all }, [row, ...computed].map((body) => ({ kind: 'step', body })));
  }, [doc, diagnosis, walked, save]);

  const finish = useCallback(async (stepId: string, outcome: EndingOutcome, note: string, startedAt: string) => {
    if (!doc || !diagnosis || !walked) return;
    if (keeping.current && !(await keeping.current)) return;
    const step = doc.steps.find((s) => s.id === stepId);
    const row: LocalRow = { id: crypto.randomUUID(), stepId, after: afterFor(walked.path, walked.path.length), note, outcome, startedAt, answeredAt: new Date().toISOString() };
    await save(diagnosis, { ...diagnosis, rows: [...diagnosis.rows, row], status: step?.kind === 'handoff' ? 'handed_off' : 'finished' }, [{ kind: 'step', body: row }]);
  }, [doc, diagnosis, walked, save]);

  const addPhoto = useCallback(async (file: File, stepId: string | null) => {
    if (!diagnosis) return;
    const thumb = await makeThumbnail(file);
    const photoId = crypto.randomUUID();
    const name = file.name.replace(/^.*[\\/]/, '') || 'photo.jpg';
    const next = { ...diagnosis, photos: [...diagnosis.photos, { id: photoId, stepId, name, thumbUrl: thumb?.dataUrl ?? '' }] };
    await save(diagnosis, next, [{ kind: 'photo', id: photoId, stepId, name, photo: file, thumb: thumb?.blob ?? null }]);
  }, [diagnosis, save]);

  return { loading, error, diagnosis, doc, branchCounts, walked, answer, finish, addPhoto };
}

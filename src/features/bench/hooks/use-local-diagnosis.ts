import { useCallback, useEffect, useMemo, useState } from 'react';
import { flushSync } from 'react-dom';
import type { ProcedureDocument } from '@shared/schema/procedure';
import type { BranchCounts } from '@shared/engine/figures';
import type { EndingOutcome } from '@shared/schema/bench';
import { commitLocal, getLocalDiagnosis, getVersion, type LocalDiagnosis, type LocalRow, type OutboxMessage } from '../../../lib/offline/db';
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

/** Reads the diagnosis and its procedure version from the phone (no network). */
function useStoredDiagnosis(id: string) {
  const [diagnosis, setDiagnosis] = useState<LocalDiagnosis | null>(null);
  const [doc, setDoc] = useState<ProcedureDocument | null>(null);
  const [branchCounts, setBranchCounts] = useState<BranchCounts>({});
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(true);
  useEffect(() => {
    let live = true;
    (async () => {
      const d = await getLocalDiagnosis(id);
      if (!d) throw new Error('This diagnosis is not on this phone. Open it from the Bench home, or start a new one.');
      const v = await getVersion(d.versionId);
      // The server sends the document already upgraded and parsed; checking it again here would
      // put the schema library into the phone's first download.
      if (!v) throw new Error('The procedure of this diagnosis is not on this phone. Connect once and open it again.');
      if (live) { setDiagnosis(d); setDoc(withMeter(v.document as ProcedureDocument, d.meterEntries)); setBranchCounts(v.branchCounts ?? {}); }
    })().catch((e: unknown) => live && setError(e instanceof Error ? e.message : String(e))).finally(() => live && setLoading(false));
    return () => { live = false; };
  }, [id]);
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

/**
 * Runs `fn` once the frame with the next step has been painted: sending starts with IndexedDB
 * reads and a request, which would otherwise delay that frame on a slow phone.
 */
function afterNextPaint(fn: () => void): void {
  if (typeof requestAnimationFrame === 'undefined') { setTimeout(fn, 0); return; }
  requestAnimationFrame(() => setTimeout(fn, 0));
}

/** A diagnosis read from and written to the phone; the outbox carries each change to the server. */
export function useLocalDiagnosis(id: string): LocalDiagnosisApi {
  const { diagnosis, setDiagnosis, doc, branchCounts, error, loading } = useStoredDiagnosis(id);
  const walked = useMemo(() => (doc && diagnosis ? walkRows(doc, diagnosis.rows) : null), [doc, diagnosis]);

  const save = useCallback(async (next: LocalDiagnosis, messages: OutboxMessage[]) => {
    performance.mark('bench:keep');
    await commitLocal(next, messages); // on the phone before the next step shows
    performance.mark('bench:kept');
    // Rendered at once, not in a later scheduler task: the next step is the only thing to do now.
    flushSync(() => setDiagnosis(next));
    afterNextPaint(() => void flushOutbox());
  }, [setDiagnosis]);

  const answer = useCallback(async (a: Answer, index?: number) => {
    if (!doc || !diagnosis || !walked) return;
    const now = new Date().toISOString();
    const row = answerRow(a, walked.path, index ?? walked.path.length, now);
    const rows = [...diagnosis.rows, row];
    const computed = formulaRows(doc, rows, now);
    await save({ ...diagnosis, rows: [...rows, ...computed] }, [row, ...computed].map((body) => ({ kind: 'step', body })));
  }, [doc, diagnosis, walked, save]);

  const finish = useCallback(async (stepId: string, outcome: EndingOutcome, note: string, startedAt: string) => {
    if (!doc || !diagnosis || !walked) return;
    const step = doc.steps.find((s) => s.id === stepId);
    const row: LocalRow = { id: crypto.randomUUID(), stepId, after: afterFor(walked.path, walked.path.length), note, outcome, startedAt, answeredAt: new Date().toISOString() };
    await save({ ...diagnosis, rows: [...diagnosis.rows, row], status: step?.kind === 'handoff' ? 'handed_off' : 'finished' }, [{ kind: 'step', body: row }]);
  }, [doc, diagnosis, walked, save]);

  const addPhoto = useCallback(async (file: File, stepId: string | null) => {
    if (!diagnosis) return;
    const thumb = await makeThumbnail(file);
    const photoId = crypto.randomUUID();
    const name = file.name.replace(/^.*[\\/]/, '') || 'photo.jpg';
    const next = { ...diagnosis, photos: [...diagnosis.photos, { id: photoId, stepId, name, thumbUrl: thumb?.dataUrl ?? '' }] };
    await save(next, [{ kind: 'photo', id: photoId, stepId, name, photo: file, thumb: thumb?.blob ?? null }]);
  }, [diagnosis, save]);

  return { loading, error, diagnosis, doc, branchCounts, walked, answer, finish, addPhoto };
}

import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { procedureDocumentSchema, type ProcedureDocument } from '@shared/schema';
import { ApiError } from '../../../lib/api-client';
import { saveDraft, type VersionIds } from '../api/versions';
import type { StaleSave } from '../api/types';

export type SaveState =
  | { kind: 'saved'; at: string }
  | { kind: 'dirty' }
  | { kind: 'saving' }
  | { kind: 'invalid'; problems: string[] }
  | { kind: 'conflict'; stale: StaleSave; message: string }
  | { kind: 'failed'; message: string };

const IDLE_MS = 3000;

/**
 * Saves the draft with the lock version it was loaded at: explicitly, and after a few seconds
 * of idle. A 409 stops autosave and reports who changed the draft, so nothing is overwritten.
 */
export function useDraftSaving(ids: VersionIds, doc: ProcedureDocument, initial: { lockVersion: number; updatedAt: string; document: ProcedureDocument }, enabled: boolean) {
  const lock = useRef(initial.lockVersion);
  const savedJson = useRef(JSON.stringify(initial.document));
  const [state, setState] = useState<SaveState>({ kind: 'saved', at: initial.updatedAt });
  const busy = useRef(false);

  const reset = useCallback((v: { lockVersion: number; updatedAt: string; document: ProcedureDocument }) => {
    lock.current = v.lockVersion;
    savedJson.current = JSON.stringify(v.document);
    setState({ kind: 'saved', at: v.updatedAt });
  }, []);

  const save = useCallback(async (current: ProcedureDocument) => {
    if (busy.current || !enabled) return;
    const json = JSON.stringify(current);
    if (json === savedJson.current) return;
    const parsed = procedureDocumentSchema.safeParse(current);
    if (!parsed.success) {
      setState({ kind: 'invalid', problems: parsed.error.issues.slice(0, 5).map((i) => `${i.path.join('.')}: ${i.message}`) });
      return;
    }
    busy.current = true;
    setState({ kind: 'saving' });
    try {
      const saved = await saveDraft(ids, parsed.data, lock.current);
      lock.current = saved.lockVersion;
      savedJson.current = json;
      setState({ kind: 'saved', at: saved.updatedAt });
    } catch (e) {
      if (e instanceof ApiError && e.status === 409 && e.code === 'stale_draft') {
        setState({ kind: 'conflict', stale: e.body as unknown as StaleSave, message: e.message });
      } else {
        setState({ kind: 'failed', message: e instanceof Error ? e.message : 'The draft could not be saved.' });
      }
    } finally {
      busy.current = false;
    }
  }, [enabled, ids]);

  const conflicted = state.kind === 'conflict';
  // once per document, not once per render: at 1 000 steps the text is about a megabyte
  const json = useMemo(() => JSON.stringify(doc), [doc]);
  useEffect(() => {
    if (!enabled || conflicted) return;
    if (json === savedJson.current) return;
    setState((s) => (s.kind === 'saving' ? s : { kind: 'dirty' }));
    const t = setTimeout(() => void save(doc), IDLE_MS);
    return () => clearTimeout(t);
  }, [doc, json, enabled, conflicted, save]);

  const dirty = json !== savedJson.current;
  return { state, save: () => save(doc), reset, dirty, lockVersion: () => lock.current };
}

import { useEffect, useMemo, useState } from 'react';
import { walkProcedure, type WalkAnswer, type WalkEntry } from '@shared/engine';
import type { ProcedureDocument } from '@shared/schema';
import { Button } from '../../../../components/ui/button';
import { Select } from '../../../../components/ui/field';
import { PreviewEnding, PreviewStep } from './preview-step';

/**
 * Walks the draft as a technician would, on the shared walker, without recording anything.
 * "Jump to step" starts the walk at another step; the path taken is reported for the canvas.
 */
export function PreviewPanel({ doc, onPath, onClose }: { doc: ProcedureDocument; onPath: (ids: string[], current: string | null) => void; onClose: () => void }) {
  const [from, setFrom] = useState(doc.start);
  const [log, setLog] = useState<WalkEntry[]>([]);
  const [refusal, setRefusal] = useState<string | null>(null);
  const walked = useMemo(() => ({ ...doc, start: from }), [doc, from]);
  const state = useMemo(() => walkProcedure(walked, log), [walked, log]);
  const picturesOf = (id: string) => doc.steps.find((s) => s.id === id)?.pictures;
  useEffect(() => onPath(state.path.map((p) => p.stepId), state.current?.id ?? null), [state, onPath]);

  function answer(a: WalkAnswer, acknowledged: boolean) {
    if (!state.current) return;
    const entry: WalkEntry = { stepId: state.current.id, answer: a, acknowledged };
    const next = walkProcedure(walked, [...log, entry]);
    const last = next.record[next.record.length - 1];
    if (last?.status === 'rejected') { setRefusal(last.problem?.message ?? 'That answer was not accepted.'); return; }
    setRefusal(null);
    setLog([...log, entry]);
  }

  return (
    <section aria-label="Preview" className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <label className="flex flex-col text-sm font-semibold">Jump to step
          <Select value={from} onChange={(e) => { setFrom(e.target.value); setLog([]); setRefusal(null); }} className="min-h-10 w-48" data-testid="preview-jump">
            {doc.steps.filter((s) => s.kind !== 'finding' && s.kind !== 'handoff').map((s) => <option key={s.id} value={s.id}>{s.title} ({s.id})</option>)}
          </Select>
        </label>
        <Button variant="ghost" disabled={log.length === 0} onClick={() => { setLog(log.slice(0, -1)); setRefusal(null); }}>Back</Button>
        <Button variant="ghost" onClick={() => { setLog([]); setRefusal(null); }}>Restart</Button>
        <Button variant="secondary" onClick={onClose}>Close preview</Button>
      </div>
      <p className="text-xs text-ink-soft">Preview only: nothing is recorded as a diagnosis.</p>
      <div className="mx-auto w-[360px] max-w-full h-[560px] overflow-y-auto rounded-[28px] border-[10px] border-ink bg-panel p-4 shadow-lg"  data-testid="preview-phone">
        {refusal && <p role="alert" className="mb-2 rounded-lg bg-stop-soft p-2 font-semibold text-stop">{refusal}</p>}
        {state.current && <PreviewStep key={`${state.current.id}-${log.length}`} view={state.current} pictures={picturesOf(state.current.id)} remeasure={state.remeasure} onAnswer={answer} />}
        {state.ending && <PreviewEnding view={state.ending} pictures={picturesOf(state.ending.id)} />}
        {state.status === 'stuck' && <p role="alert" className="rounded-lg bg-stop-soft p-2 text-stop">{state.problem?.message}</p>}
      </div>
    </section>
  );
}

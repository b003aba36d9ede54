import { useRef, useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/card';
import { ApiError } from '../../../lib/api-client';
import { importProcedure } from '../api/procedures';
import { draftingKeys } from '../api/queries';

/** Imports an exported procedure file as a new draft; problems are listed step by step. */
export function ImportButton() {
  const input = useRef<HTMLInputElement>(null);
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [problem, setProblem] = useState<{ message: string; issues: { path: string; message: string }[] } | null>(null);
  const [busy, setBusy] = useState(false);

  async function onFile(file: File) {
    setProblem(null);
    setBusy(true);
    try {
      let json: unknown;
      try { json = JSON.parse(await file.text()); } catch {
        setProblem({ message: `${file.name} is not a JSON file. Export a procedure from Drafting and import that file.`, issues: [] });
        return;
      }
      const created = await importProcedure(json);
      void qc.invalidateQueries({ queryKey: draftingKeys.lists() });
      navigate(`/drafting/${created.procedureId}/versions/${created.draftId}`);
    } catch (e) {
      setProblem(e instanceof ApiError ? { message: e.message, issues: e.issues } : { message: 'The import failed. Try again.', issues: [] });
    } finally {
      setBusy(false);
      if (input.current) input.current.value = '';
    }
  }

  return (
    <>
      <input ref={input} type="file" accept="application/json,.json" className="sr-only" aria-label="Procedure file to import" data-testid="import-file"
        onChange={(e) => { const f = e.target.files?.[0]; if (f) void onFile(f); }} />
      <Button variant="secondary" busy={busy} onClick={() => input.current?.click()}>Import…</Button>
      {problem && (
        <div className="basis-full">
          <Alert title="Nothing was imported">
            <p>{problem.message}</p>
            {problem.issues.length > 0 && <ul className="mt-2 list-disc pl-5">{problem.issues.map((i, n) => <li key={n}><code>{i.path}</code>: {i.message}</li>)}</ul>}
          </Alert>
        </div>
      )}
    </>
  );
}

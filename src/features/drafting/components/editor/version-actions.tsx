import { may, type Role } from '@shared/schema/role-names';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ProcedureDocument } from '@shared/schema';
import { Button } from '../../../../components/ui/button';
import { Alert } from '../../../../components/ui/card';
import { Textarea } from '../../../../components/ui/field';
import { ApiError } from '../../../../lib/api-client';
import { draftingKeys } from '../../api/queries';
import { importProcedure } from '../../api/procedures';
import { moveVersion, startDraft, exportUrl, type Move, type VersionIds } from '../../api/versions';
import type { VersionDetail } from '../../api/types';
import type { SaveState } from '../../hooks/use-draft-saving';
import { useFormat } from '../../../../lib/format';

interface Props {
  ids: VersionIds;
  version: VersionDetail;
  roles: Role[];
  hasOpenDraft: boolean;
  errors: number;
  beforeMove: () => Promise<void>;
  onChanged: () => void;
}

/** The life-cycle buttons this person may use on this version. */
export function VersionActions({ ids, version, roles, hasOpenDraft, errors, beforeMove, onChanged }: Props) {
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [reason, setReason] = useState('');
  const [asking, setAsking] = useState(false);
  const move = useMutation({
    mutationFn: async (m: Move) => { if (m === 'submit') await beforeMove(); return moveVersion(ids, m, m === 'send-back' ? reason : undefined); },
    onSuccess: () => { setAsking(false); void qc.invalidateQueries({ queryKey: draftingKeys.all }); onChanged(); },
  });
  const fresh = useMutation({
    mutationFn: () => startDraft(ids.procedureId, version.id),
    onSuccess: (v) => { void qc.invalidateQueries({ queryKey: draftingKeys.all }); navigate(`/drafting/${ids.procedureId}/versions/${v.id}`); },
  });
  const author = may(roles, 'procedure.author');
  const lead = may(roles, 'procedure.review');
  return (
    <div className="flex flex-wrap items-center gap-2">
      <a className="min-h-10 content-center rounded-md border border-line bg-panel px-3 text-sm font-semibold hover:border-ink" href={exportUrl(ids)} download>Export</a>
      {version.status === 'draft' && author && <Button onClick={() => move.mutate('submit')} busy={move.isPending}>Send for review</Button>}
      {version.status === 'in_review' && author && (
        <Button variant="secondary" onClick={() => move.mutate('take-back')} busy={move.isPending} title="Back to a draft you can edit; send it for review again when ready">Take back to edit</Button>
      )}
      {version.status === 'in_review' && lead && (
        <>
          <Button onClick={() => move.mutate('publish')} busy={move.isPending} title={errors > 0 ? 'The soundness check has errors' : undefined}>Publish</Button>
          <Button variant="secondary" onClick={() => setAsking((a) => !a)}>Send back</Button>
        </>
      )}
      {version.status === 'published' && lead && <Button variant="secondary" onClick={() => move.mutate('retire')} busy={move.isPending}>Retire</Button>}
      {(version.status === 'published' || version.status === 'retired') && author && !hasOpenDraft && (
        <Button onClick={() => fresh.mutate()} busy={fresh.isPending}>New draft from this version</Button>
      )}
      {asking && (
        <form className="flex basis-full items-end gap-2" onSubmit={(e) => { e.preventDefault(); move.mutate('send-back'); }}>
          <Textarea aria-label="Why it goes back" value={reason} rows={2} placeholder="What the author should change" onChange={(e) => setReason(e.target.value)} />
          <Button type="submit" busy={move.isPending}>Send back to the author</Button>
        </form>
      )}
      {(move.error ?? fresh.error) && (
        <div className="basis-full"><Alert title="Not done">{(move.error ?? fresh.error)!.message}
          {move.error instanceof ApiError && move.error.issues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">{move.error.issues.map((i, n) => <li key={n}>{i.message}</li>)}</ul>)}
        </Alert></div>
      )}
    </div>
  );
}

/** A stale save: reload the other person's draft, or keep this copy as a new procedure. */
export function ConflictNotice({ state, doc, onReload }: { state: Extract<SaveState, { kind: 'conflict' }>; doc: ProcedureDocument; onReload: () => void }) {
  const navigate = useNavigate();
  const fmt = useFormat();
  const keep = useMutation({
    mutationFn: () => importProcedure(doc, `${doc.meta.title} (my copy)`.slice(0, 120)),
    onSuccess: (c) => navigate(`/drafting/${c.procedureId}/versions/${c.draftId}`),
  });
  return (
    <Alert title={`${state.stale.changedBy} changed this draft at ${fmt.timeWithSeconds(state.stale.changedAt)}`}>
      <p>Your changes are not saved and nothing was overwritten. Load their version (your changes here are dropped), or keep your copy as a new procedure.</p>
      <div className="mt-2 flex gap-2">
        <Button onClick={onReload}>Load their version</Button>
        <Button variant="secondary" busy={keep.isPending} onClick={() => keep.mutate()}>Keep my copy</Button>
      </div>
      {keep.error && <p className="mt-1 text-stop">{keep.error.message}</p>}
    </Alert>
  );
}

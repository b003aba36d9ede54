import { useState } from 'react';
import { useParams, Link } from 'react-router-dom';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { ReactFlowProvider } from '@xyflow/react';
import { Alert, Spinner } from '../../../../components/ui/card';
import { useSession } from '../../../../lib/session';
import { draftingKeys, draftingQueries } from '../../api/queries';
import type { ProcedureDetail } from '../../api/types';
import { Workspace } from './workspace';

/** The published version a draft would replace: the newest one numbered below it (or any, for drafts). */
function baseOf(detail: ProcedureDetail | undefined, versionId: string): string | null {
  // from the procedure's version list alone, so the base loads alongside the version, not after it
  const version = detail?.versions.find((v) => v.id === versionId);
  if (!detail || !version) return null;
  const numbered = detail.versions.filter((v) => v.status === 'published' || v.status === 'retired');
  const older = numbered.filter((v) => version.number === null || (v.number ?? 0) < version.number);
  const published = older.filter((v) => v.status === 'published');
  const pick = (published.length ? published : older).sort((a, b) => (b.number ?? 0) - (a.number ?? 0))[0];
  return pick?.id ?? null;
}

/** Loads a version of a procedure into the editor (the route that brings in the canvas). */
export default function EditorPage() {
  const { procedureId = '', versionId = '' } = useParams();
  const { roles } = useSession();
  const qc = useQueryClient();
  const [generation, setGeneration] = useState(0);
  const detail = useQuery(draftingQueries.procedure(procedureId));
  const version = useQuery(draftingQueries.version(procedureId, versionId));
  const baseId = baseOf(detail.data, versionId);
  const base = useQuery({ ...draftingQueries.version(procedureId, baseId ?? ''), enabled: baseId !== null });

  if (version.error || detail.error) {
    return <Alert title="This procedure could not be opened">{(version.error ?? detail.error)!.message} <Link to="/drafting" className="underline">Back to the list</Link></Alert>;
  }
  if (!version.data || !detail.data || (baseId && !base.data)) return <Spinner label="Opening the editor" />;
  const reload = async () => {
    await qc.invalidateQueries({ queryKey: draftingKeys.procedure(procedureId) });
    await qc.refetchQueries({ queryKey: draftingKeys.version(procedureId, versionId) });
    setGeneration((g) => g + 1);
  };
  const hasOpenDraft = detail.data.versions.some((v) => v.status === 'draft' || v.status === 'in_review');
  return (
    <ReactFlowProvider>
      <Workspace
        key={`${version.data.id}:${version.data.status}:${generation}`}
        ids={{ procedureId, versionId }}
        version={version.data}
        base={baseId ? base.data ?? null : null}
        roles={roles}
        hasOpenDraft={hasOpenDraft}
        versions={detail.data.versions}
        onReload={() => void reload()}
      />
    </ReactFlowProvider>
  );
}

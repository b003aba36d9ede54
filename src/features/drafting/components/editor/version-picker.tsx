import { useNavigate } from 'react-router-dom';
import type { VersionSummary } from '../../api/types';

const label = (v: VersionSummary) =>
  v.number === null ? (v.status === 'in_review' ? 'Draft in review' : 'Draft') : `Version ${v.number}${v.status === 'retired' ? ' (retired)' : ''}`;

/** Every version of the procedure, so a lead can open an older one to compare or retire it. */
export function VersionPicker({ procedureId, current, versions }: { procedureId: string; current: string; versions: VersionSummary[] }) {
  const navigate = useNavigate();
  if (versions.length < 2) return null;
  return (
    <label className="flex items-center gap-2 text-sm font-semibold">
      <span className="sr-only">Open another version</span>
      <select value={current} onChange={(e) => navigate(`/drafting/${procedureId}/versions/${e.target.value}`)}
        className="min-h-10 rounded-md border-2 border-line bg-panel px-2" data-testid="version-picker">
        {versions.map((v) => <option key={v.id} value={v.id}>{label(v)}</option>)}
      </select>
    </label>
  );
}

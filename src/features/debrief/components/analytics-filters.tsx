import { Field, Input, Select } from '../../../components/ui/field';
import type { DebriefProcedure } from '../api/types';
import { useDebriefFormat } from '../hooks/use-debrief-format';

export interface AnalyticsSelection { procedureId: string; versionId?: string; from?: string; to?: string }

/** Which procedure, which version (or all) and which days the analytics cover. */
export function AnalyticsFilters({ procedures, value, onChange }: {
  procedures: DebriefProcedure[]; value: AnalyticsSelection; onChange: (v: AnalyticsSelection) => void;
}) {
  const chosen = procedures.find((p) => p.id === value.procedureId);
  const df = useDebriefFormat();
  return (
    <div className="grid grid-cols-2 gap-3 md:grid-cols-5" role="search" aria-label="Analytics scope">
      <Field label="Procedure" className="col-span-2">
        <Select value={value.procedureId} onChange={(e) => onChange({ procedureId: e.target.value, from: value.from, to: value.to })}>
          {procedures.map((p) => <option key={p.id} value={p.id}>{p.title} ({df.count(p.diagnoses)} diagnoses)</option>)}
        </Select>
      </Field>
      <Field label="Version">
        <Select value={value.versionId ?? ''} onChange={(e) => onChange({ ...value, versionId: e.target.value || undefined })}>
          <option value="">All versions</option>
          {chosen?.versions.map((v) => <option key={v.id} value={v.id}>v{v.number} ({df.count(v.diagnoses)})</option>)}
        </Select>
      </Field>
      <Field label="From">
        <Input type="date" value={value.from ?? ''} onChange={(e) => onChange({ ...value, from: e.target.value || undefined })} />
      </Field>
      <Field label="To">
        <Input type="date" value={value.to ?? ''} onChange={(e) => onChange({ ...value, to: e.target.value || undefined })} />
      </Field>
    </div>
  );
}

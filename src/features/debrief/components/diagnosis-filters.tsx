import { useQuery } from '@tanstack/react-query';
import { Field, Input, Select } from '../../../components/ui/field';
import { DIAGNOSIS_STATUSES, type DiagnosisListQuery } from '@shared/stats/debrief-schema';
import { debriefQueries } from '../api/queries';
import { STATUS_LABEL } from '../lib/format';

type Patch = Partial<Record<string, string | number | undefined>>;

/** Filters of the diagnoses table; each change goes to the server (filtering never happens on the page). */
export function DiagnosisFilters({ q, onChange }: { q: Partial<DiagnosisListQuery>; onChange: (p: Patch) => void }) {
  const procedures = useQuery(debriefQueries.procedures());
  const technicians = useQuery(debriefQueries.technicians());
  const chosen = procedures.data?.find((p) => p.id === q.procedureId);
  return (
    <div className="grid grid-cols-2 gap-3 md:grid-cols-4 xl:grid-cols-6" role="search" aria-label="Filter diagnoses">
      <Field label="Procedure" className="col-span-2">
        <Select value={q.procedureId ?? ''} onChange={(e) => onChange({ procedureId: e.target.value, versionId: undefined, endingStepId: undefined })}>
          <option value="">All procedures</option>
          {procedures.data?.map((p) => <option key={p.id} value={p.id}>{p.title}</option>)}
        </Select>
      </Field>
      <Field label="Version">
        <Select value={q.versionId ?? ''} disabled={!chosen} onChange={(e) => onChange({ versionId: e.target.value })}>
          <option value="">All versions</option>
          {chosen?.versions.map((v) => <option key={v.id} value={v.id}>v{v.number}</option>)}
        </Select>
      </Field>
      <Field label="Technician">
        <Select value={q.technicianId ?? ''} onChange={(e) => onChange({ technicianId: e.target.value })}>
          <option value="">Everyone</option>
          {technicians.data?.map((t) => <option key={t.id} value={t.id}>{t.name}</option>)}
        </Select>
      </Field>
      <Field label="Status">
        <Select value={q.status ?? ''} onChange={(e) => onChange({ status: e.target.value })}>
          <option value="">Any status</option>
          {DIAGNOSIS_STATUSES.map((s) => <option key={s} value={s}>{STATUS_LABEL[s]}</option>)}
        </Select>
      </Field>
      <Field label="Flag">
        <Select value={q.flag ?? ''} onChange={(e) => onChange({ flag: e.target.value })}>
          <option value="">Any</option>
          <option value="borderline">Borderline on the way</option>
          <option value="taken-back">Step taken back</option>
          <option value="comeback">Came back</option>
        </Select>
      </Field>
      <Field label="Vehicle">
        <Input defaultValue={q.vehicle ?? ''} placeholder="Label or model" onBlur={(e) => onChange({ vehicle: e.target.value.trim() })}
          onKeyDown={(e) => { if (e.key === 'Enter') onChange({ vehicle: e.currentTarget.value.trim() }); }} />
      </Field>
      <Field label="From">
        <Input type="date" value={q.from ?? ''} onChange={(e) => onChange({ from: e.target.value })} />
      </Field>
      <Field label="To">
        <Input type="date" value={q.to ?? ''} onChange={(e) => onChange({ to: e.target.value })} />
      </Field>
    </div>
  );
}

import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { PageHeader, Badge, Alert, Spinner, EmptyState } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { Input, Select } from '../../../components/ui/field';
import { useSession } from '../../../lib/session';
import { draftingKeys, draftingQueries } from '../api/queries';
import { archiveProcedure, duplicateProcedure } from '../api/procedures';
import type { ListFilter, ProcedureRow } from '../api/types';
import { CreateProcedureForm } from './create-procedure-form';
import { ImportButton } from './import-button';
import { IGNITION_LABELS, StatusBadge } from './labels';
import { useFormat } from '../../../lib/format';

function openLink(p: ProcedureRow): string | null {
  const id = p.draft?.id ?? p.published?.id;
  return id ? `/drafting/${p.id}/versions/${id}` : null;
}

function Row({ p, canAuthor, canArchive }: { p: ProcedureRow; canAuthor: boolean; canArchive: boolean }) {
  const qc = useQueryClient();
  const navigate = useNavigate();
  const refresh = () => qc.invalidateQueries({ queryKey: draftingKeys.lists() });
  const dup = useMutation({ mutationFn: () => duplicateProcedure(p.id), onSuccess: (c) => { void refresh(); navigate(`/drafting/${c.procedureId}/versions/${c.draftId}`); } });
  const arch = useMutation({ mutationFn: () => archiveProcedure(p.id, !p.archived), onSuccess: refresh });
  const link = openLink(p);
  const fmt = useFormat();
  return (
    <tr className="border-t border-line align-top">
      <td className="px-3 py-2">
        {link ? <Link to={link} className="font-semibold text-ink underline decoration-signal decoration-2 underline-offset-4 hover:text-signal">{p.title}</Link> : <span className="font-semibold">{p.title}</span>}
        <div className="text-sm text-ink-soft">{p.slug}</div>
      </td>
      <td className="px-3 py-2">{p.symptom}</td>
      <td className="px-3 py-2">{IGNITION_LABELS[p.ignitionSystem] ?? p.ignitionSystem}</td>
      <td className="px-3 py-2">{p.draft ? <StatusBadge status={p.draft.status} /> : <span className="text-ink-soft">none</span>}</td>
      <td className="px-3 py-2">{p.published ? <><Badge tone="go">v{p.published.number}</Badge>{p.published.publishedAt && <div className="text-sm text-ink-soft">{fmt.date(p.published.publishedAt)}</div>}</> : <span className="text-ink-soft">not yet</span>}</td>
      <td className="px-3 py-2 text-sm">{p.lastEditedBy ?? '—'}<div className="text-ink-soft">{fmt.dateTime(p.lastEditedAt)}</div></td>
      <td className="px-3 py-2 text-right tabular-nums">{fmt.count(p.diagnoses)}</td>
      <td className="px-3 py-2">
        <div className="flex flex-wrap justify-end gap-2">
          {canAuthor && <Button variant="secondary" busy={dup.isPending} onClick={() => dup.mutate()} aria-label={`Duplicate ${p.title}`}>Duplicate</Button>}
          {canArchive && <Button variant="ghost" busy={arch.isPending} onClick={() => arch.mutate()} aria-label={`${p.archived ? 'Restore' : 'Archive'} ${p.title}`}>{p.archived ? 'Restore' : 'Archive'}</Button>}
        </div>
        {(dup.error ?? arch.error) && <p role="alert" className="mt-1 text-sm text-stop">{(dup.error ?? arch.error)!.message}</p>}
      </td>
    </tr>
  );
}

const STATUS_OPTIONS: [ListFilter['status'], string][] = [
  ['any', 'Any'], ['draft', 'Has a draft'], ['in_review', 'In review'], ['published', 'Published'], ['unpublished', 'Never published'],
];

function ListFilters({ filter, onChange }: { filter: ListFilter; onChange: (f: ListFilter) => void }) {
  return (
    <div role="search" className="mb-3 flex flex-wrap items-end gap-3">
      <label className="flex flex-col gap-1 font-semibold">Search
        <Input type="search" value={filter.q} placeholder="Title or symptom" className="w-72" onChange={(e) => onChange({ ...filter, q: e.target.value })} />
      </label>
      <label className="flex flex-col gap-1 font-semibold">Status
        <Select value={filter.status} className="w-56" onChange={(e) => onChange({ ...filter, status: e.target.value as ListFilter['status'] })}>
          {STATUS_OPTIONS.map(([value, label]) => <option key={value} value={value}>{label}</option>)}
        </Select>
      </label>
      <label className="flex min-h-11 items-center gap-2 font-semibold">
        <input type="checkbox" className="h-5 w-5 accent-[var(--color-signal)]" checked={filter.archived} onChange={(e) => onChange({ ...filter, archived: e.target.checked })} />
        Archived only
      </label>
    </div>
  );
}

function ProcedureTable({ rows, canAuthor, canArchive }: { rows: ProcedureRow[]; canAuthor: boolean; canArchive: boolean }) {
  return (
    <div className="overflow-x-auto rounded-[var(--radius-card)] border border-line bg-panel">
      <table className="w-full text-left">
        <caption className="sr-only">Procedures</caption>
        <thead className="bg-ink/5 text-sm uppercase tracking-wide text-ink-soft">
          <tr>
            {['Procedure', 'Symptom', 'Ignition', 'Draft', 'Published', 'Last edited', 'Diagnoses', ''].map((h, i) => (
              <th key={i} scope="col" className={`px-3 py-2 font-bold ${h === 'Diagnoses' ? 'text-right' : ''}`}>{h || <span className="sr-only">Actions</span>}</th>
            ))}
          </tr>
        </thead>
        <tbody>{rows.map((p) => <Row key={p.id} p={p} canAuthor={canAuthor} canArchive={canArchive} />)}</tbody>
      </table>
    </div>
  );
}

/** Drafting home: the shop's procedures with their draft and published state. */
export function ProcedureListPage() {
  const session = useSession();
  const canAuthor = session.may('procedure.author');
  const canArchive = session.may('procedure.draft');
  const [filter, setFilter] = useState<ListFilter>({ q: '', status: 'any', archived: false });
  const [creating, setCreating] = useState(false);
  const list = useQuery(draftingQueries.list(filter));
  return (
    <div>
      <PageHeader
        title="Drafting"
        subtitle="Procedures of this shop: draw them, preview them, send them for review."
        actions={canAuthor && <><ImportButton /><Button onClick={() => setCreating((c) => !c)}>New procedure</Button></>}
      />
      {creating && <CreateProcedureForm onCancel={() => setCreating(false)} />}
      <ListFilters filter={filter} onChange={setFilter} />
      {list.isLoading && <Spinner label="Loading procedures" />}
      {list.error && <Alert title="The list could not be loaded">{list.error.message}</Alert>}
      {list.data && list.data.length === 0 && <EmptyState title="No procedures match">Change the search, or create a new procedure.</EmptyState>}
      {list.data && list.data.length > 0 && <ProcedureTable rows={list.data} canAuthor={canAuthor} canArchive={canArchive} />}
    </div>
  );
}

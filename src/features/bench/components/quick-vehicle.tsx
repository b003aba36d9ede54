import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { api, ApiError } from '../../../lib/api-client';
import { Alert } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { Field, Input } from '../../../components/ui/field';
import { benchQueries } from '../api/queries';
import type { VehicleDto as Vehicle } from '@shared/schema/vehicle';

/** Adds a machine from the start page; the new machine is in the list (and picked) at once. */
export function QuickVehicle({ onAdded, initialLabel = '' }: { onAdded(v: Vehicle): void; initialLabel?: string }) {
  const qc = useQueryClient();
  const [f, setF] = useState({ label: initialLabel, model: '', frameNumber: '', hours: '' });
  const [error, setError] = useState<ApiError | null>(null);
  const issue = (path: string) => error?.issues.find((i) => i.path === path)?.message;
  const add = async () => {
    try {
      const v = await api.post<Vehicle>('/api/vehicles', { label: f.label, model: f.model, frameNumber: f.frameNumber, hours: f.hours === '' ? null : Number(f.hours.replace(',', '.')) });
      const key = benchQueries.vehicles().queryKey;
      qc.setQueryData<Vehicle[]>(key, (old) => [...(old ?? []), { ...v, lastDiagnosedAt: null }]);
      void qc.invalidateQueries({ queryKey: key });
      onAdded(v);
    } catch (e) { setError(e instanceof ApiError ? e : null); }
  };
  return (
    <div className="space-y-2 rounded-lg border-2 border-dashed border-line p-3">
      <Field label="Label" error={issue('label')}><Input value={f.label} onChange={(e) => setF({ ...f, label: e.target.value })} /></Field>
      <Field label="Model"><Input value={f.model} onChange={(e) => setF({ ...f, model: e.target.value })} /></Field>
      <Field label="Frame number or VIN" error={issue('frameNumber')}><Input value={f.frameNumber} onChange={(e) => setF({ ...f, frameNumber: e.target.value.toUpperCase() })} /></Field>
      <Field label="Hours" error={issue('hours')}><Input inputMode="decimal" value={f.hours} onChange={(e) => setF({ ...f, hours: e.target.value })} /></Field>
      {error && !error.issues.length && <Alert>{error.message}</Alert>}
      <Button variant="secondary" className="min-h-12 w-full" onClick={() => void add()}>Add this machine</Button>
    </div>
  );
}


import { useMemo, useState } from 'react';
import { Input } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import type { VehicleDto as Vehicle } from '@shared/schema/vehicle';
import { matchMachines } from '../lib/machines';
import { QuickVehicle } from './quick-vehicle';
import { useFormat } from '../../../lib/format';

/** How many matches the list shows at once: a thumb's scroll, not the whole fleet. */
const SHOWN = 6;

function MachineOption({ v, checked, onPick }: { v: Vehicle; checked: boolean; onPick(): void }) {
  const fmt = useFormat();
  return (
    <label className="flex min-h-16 min-w-0 cursor-pointer items-center gap-3 rounded-lg border-2 border-ink/40 bg-paper px-3 py-2 has-[:checked]:border-signal has-[:checked]:bg-signal-soft">
      <input type="radio" name="machine" className="h-6 w-6 shrink-0 accent-signal" value={v.id} checked={checked} onChange={onPick} />
      <span className="min-w-0 text-lg font-semibold">{v.label} <span className="font-normal">{v.model}</span>
        <span className="block break-words text-base font-normal text-ink-soft">
          {v.frameNumber || 'no frame number'} · {v.lastDiagnosedAt ? `last diagnosed ${fmt.date(v.lastDiagnosedAt)}` : 'never diagnosed'}
        </span>
      </span>
    </label>
  );
}

/**
 * The machine of a diagnosis: a search over fleet label, model and frame number or VIN, with
 * the matches as whole-card choices (48 px and more) and, for those who may, a machine added inline.
 */
export function MachinePicker({ vehicles, value, onChange, canAdd }: {
  vehicles: Vehicle[] | undefined; value: string; onChange(id: string): void; canAdd: boolean;
}) {
  const [query, setQuery] = useState('');
  const [adding, setAdding] = useState(false);
  const matches = useMemo(() => matchMachines(vehicles ?? [], query), [vehicles, query]);
  const picked = vehicles?.find((v) => v.id === value);
  // the picked machine stays in view whatever the search, first
  const shown = [...(picked ? [picked] : []), ...matches.filter((v) => v.id !== value)].slice(0, SHOWN);
  return (
    // min-w-0: a fieldset is as wide as its widest content by default, and a long VIN would push the page sideways
    <fieldset className="min-w-0 space-y-3 rounded-lg border border-line bg-panel p-3">
      <legend className="px-1 text-lg font-bold">Machine</legend>
      <label className="block space-y-1">
        <span className="font-semibold">Find a machine</span>
        <Input type="search" value={query} onChange={(e) => setQuery(e.target.value)} placeholder="Fleet label, model, VIN or frame number" enterKeyHint="search" autoComplete="off" />
      </label>
      <div role="radiogroup" aria-label="Machines" className="grid gap-2">
        {shown.map((v) => <MachineOption key={v.id} v={v} checked={v.id === value} onPick={() => onChange(v.id)} />)}
        {vehicles && matches.length === 0 && <p>No machine matches "{query}".</p>}
        {matches.length > SHOWN && <p className="text-ink-soft">{matches.length - SHOWN + (picked && !matches.includes(picked) ? 1 : 0)} more: type more of the label or number.</p>}
      </div>
      {canAdd && (adding
        ? <QuickVehicle initialLabel={matches.length === 0 ? query.trim().toUpperCase() : ''} onAdded={(v) => { onChange(v.id); setQuery(''); setAdding(false); }} />
        : <Button variant="secondary" className="min-h-12 w-full" onClick={() => setAdding(true)}>Add a machine</Button>)}
    </fieldset>
  );
}

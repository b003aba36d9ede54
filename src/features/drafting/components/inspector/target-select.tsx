import { Select } from '../../../../components/ui/field';
import { UNCONNECTED } from '../../lib/edits';

/** Where a branch goes: any step of the procedure, or not connected yet. */
export function TargetSelect({ label, value, stepIds, onChange }: { label: string; value: string; stepIds: string[]; onChange: (id: string) => void }) {
  const known = stepIds.includes(value);
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="shrink-0 text-ink-soft">goes to</span>
      <Select aria-label={label} value={known ? value : UNCONNECTED} onChange={(e) => onChange(e.target.value)} className="min-h-10">
        <option value={UNCONNECTED}>— not connected —</option>
        {stepIds.map((id) => <option key={id} value={id}>{id}</option>)}
      </Select>
    </label>
  );
}

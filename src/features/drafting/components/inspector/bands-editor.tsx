import type { Band, BandEnd } from '@shared/schema';
import type { Quantity } from '@shared/measure';
import { Button } from '../../../../components/ui/button';
import { Input } from '../../../../components/ui/field';
import { freeId } from '../../lib/free-id';
import { NumberInput } from './number-input';
import { TargetSelect } from './target-select';
import { BandLine } from './band-line';

function EndInput({ end, factor, side, onChange, label }: { end: BandEnd | undefined; factor: number; side: 'lower' | 'upper'; onChange: (e: BandEnd | undefined) => void; label: string }) {
  const open = end === undefined;
  return (
    <div className="flex items-center gap-1 text-sm">
      <span className="w-8 text-ink-soft">{side === 'lower' ? 'from' : 'to'}</span>
      {open ? (
        <span className="w-[8.5rem] text-center text-ink-soft">{side === 'lower' ? '−∞' : '+∞'}</span>
      ) : (
        <>
          <select aria-label={`${label}: ${side} end included`} value={end.inclusive ? 'in' : 'out'} className="min-h-11 rounded border-2 border-line bg-panel px-1"
            onChange={(e) => onChange({ ...end, inclusive: e.target.value === 'in' })}>
            {side === 'lower' ? <><option value="in">≥</option><option value="out">&gt;</option></> : <><option value="in">≤</option><option value="out">&lt;</option></>}
          </select>
          <NumberInput label={`${label}: ${side} end`} value={end.value} factor={factor} onCommit={(v) => v !== undefined && onChange({ ...end, value: v })} className="w-24" />
        </>
      )}
      <label className="flex items-center gap-1 whitespace-nowrap text-xs text-ink-soft">
        <input type="checkbox" checked={open} aria-label={`${label}: no ${side} end`} onChange={(e) => onChange(e.target.checked ? undefined : { value: 0, inclusive: side === 'lower' })} />
        no end
      </label>
    </div>
  );
}

/** The bands of a Reading or Formula: each routes an interval of the value to a next step. */
export function BandsEditor({ bands, factor, quantity, unit, stepIds, disabled, onChange }: {
  bands: Band[]; factor: number; quantity: Quantity; unit: string; stepIds: string[]; disabled: boolean; onChange: (b: Band[]) => void;
}) {
  const set = (i: number, patch: Partial<Band>) => onChange(bands.map((b, j) => {
    if (j !== i) return b;
    const next = { ...b, ...patch };
    if ('lower' in patch && patch.lower === undefined) delete next.lower;
    if ('upper' in patch && patch.upper === undefined) delete next.upper;
    return next;
  }));
  return (
    <fieldset disabled={disabled} className="flex flex-col gap-2">
      <legend className="font-semibold">Bands <span className="font-normal text-ink-soft">(in {unit || 'the quantity'})</span></legend>
      <BandLine bands={bands} quantity={quantity} unit={unit} />
      {bands.map((b, i) => (
        <div key={b.id} className="flex flex-col gap-1 rounded-lg border border-line p-2" data-testid={`band-row-${b.id}`}>
          <div className="flex items-center gap-2">
            <Input aria-label={`Band ${i + 1} label`} value={b.label} onChange={(e) => set(i, { label: e.target.value })} />
            <Button variant="ghost" aria-label={`Remove band ${b.label}`} onClick={() => onChange(bands.filter((_, j) => j !== i))}>✕</Button>
          </div>
          <div className="flex flex-col gap-1">
            <EndInput end={b.lower} factor={factor} side="lower" label={`Band ${b.label}`} onChange={(e) => set(i, { lower: e })} />
            <EndInput end={b.upper} factor={factor} side="upper" label={`Band ${b.label}`} onChange={(e) => set(i, { upper: e })} />
          </div>
          <TargetSelect label={`Band ${b.label} goes to`} value={b.next} stepIds={stepIds} onChange={(next) => set(i, { next })} />
        </div>
      ))}
      <Button variant="secondary" onClick={() => {
        const id = freeId(new Set(bands.map((b) => b.id)), 'band');
        onChange([...bands, { id, label: `Band ${bands.length + 1}`, next: '_unconnected' }]);
      }}>Add band</Button>
    </fieldset>
  );
}

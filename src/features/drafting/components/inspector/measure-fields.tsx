import { QUANTITY_INFO, READING_QUANTITIES, QUANTITIES, type Quantity } from '@shared/measure';
import type { Limits, MeterSpec } from '@shared/schema';
import { Select } from '../../../../components/ui/field';
import { NumberInput } from './number-input';

export const unitFactor = (q: Quantity, unit: string) => QUANTITY_INFO[q].displayUnits[unit] ?? 1;

/** Quantity and display unit; changing the quantity picks its default unit. */
export function QuantityUnit({ quantity, unit, readingOnly, onChange }: { quantity: Quantity; unit: string; readingOnly: boolean; onChange: (v: { quantity: Quantity; unit: string }) => void }) {
  const list = readingOnly ? READING_QUANTITIES : QUANTITIES;
  return (
    <div className="grid grid-cols-[2fr_1fr] gap-2">
      <label className="flex flex-col gap-1 font-semibold">Quantity
        <Select value={quantity} onChange={(e) => { const q = e.target.value as Quantity; onChange({ quantity: q, unit: QUANTITY_INFO[q].defaultUnit }); }}>
          {list.map((q) => <option key={q} value={q}>{QUANTITY_INFO[q].label}</option>)}
        </Select>
      </label>
      <label className="flex flex-col gap-1 font-semibold">Unit
        <Select value={unit} onChange={(e) => onChange({ quantity, unit: e.target.value })}>
          {Object.keys(QUANTITY_INFO[quantity].displayUnits).map((u) => <option key={u} value={u}>{u || '(none)'}</option>)}
        </Select>
      </label>
    </div>
  );
}

/** Limits as a range (either end open) or nominal ± percent, typed in the display unit. */
export function LimitsFields({ limits, factor, unit, onChange }: { limits: Limits | undefined; factor: number; unit: string; onChange: (l: Limits | undefined) => void }) {
  const kind = limits?.kind ?? 'none';
  return (
    <div className="flex flex-col gap-2">
      <label className="flex flex-col gap-1 font-semibold">Limits
        <Select value={kind} onChange={(e) => {
          const k = e.target.value;
          onChange(k === 'range' ? { kind: 'range', min: 0, max: 1 } : k === 'nominal' ? { kind: 'nominal', nominal: 1, tolerancePercent: 10 } : undefined);
        }}>
          <option value="none">No limits</option>
          <option value="range">Minimum and maximum</option>
          <option value="nominal">Nominal ± percent</option>
        </Select>
      </label>
      {limits?.kind === 'range' && (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          min <NumberInput label="Minimum" allowEmpty value={limits.min} factor={factor} onCommit={(v) => onChange({ kind: 'range', max: limits.max, ...(v === undefined ? {} : { min: v }) })} />
          max <NumberInput label="Maximum" allowEmpty value={limits.max} factor={factor} onCommit={(v) => onChange({ kind: 'range', min: limits.min, ...(v === undefined ? {} : { max: v }) })} />
          <span className="text-ink-soft">{unit}</span>
        </div>
      )}
      {limits?.kind === 'nominal' && (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <NumberInput label="Nominal" value={limits.nominal} factor={factor} onCommit={(v) => v !== undefined && onChange({ ...limits, nominal: v })} />
          {unit} ±
          <NumberInput label="Tolerance percent" value={limits.tolerancePercent} onCommit={(v) => v !== undefined && onChange({ ...limits, tolerancePercent: v })} className="w-20" /> %
        </div>
      )}
    </div>
  );
}

/** The meter's accuracy ±(% of reading + counts) at a resolution, which the verdict takes into account. */
export function MeterFields({ meter, factor, unit, onChange }: { meter: MeterSpec | undefined; factor: number; unit: string; onChange: (m: MeterSpec | undefined) => void }) {
  return (
    <div className="flex flex-col gap-1">
      <label className="flex items-center gap-2 font-semibold">
        <input type="checkbox" checked={meter !== undefined} onChange={(e) => onChange(e.target.checked ? { percentOfReading: 1, counts: 2, resolution: factor * 0.1 } : undefined)} />
        Meter accuracy
      </label>
      {meter && (
        <div className="flex flex-wrap items-center gap-1 text-sm">
          ±(<NumberInput label="Percent of reading" value={meter.percentOfReading} onCommit={(v) => v !== undefined && onChange({ ...meter, percentOfReading: v })} className="w-16" /> % +
          <NumberInput label="Counts" value={meter.counts} onCommit={(v) => v !== undefined && onChange({ ...meter, counts: Math.round(v) })} className="w-16" /> counts) at
          <NumberInput label="Resolution" value={meter.resolution} factor={factor} onCommit={(v) => v !== undefined && onChange({ ...meter, resolution: v })} className="w-20" /> {unit}
        </div>
      )}
    </div>
  );
}

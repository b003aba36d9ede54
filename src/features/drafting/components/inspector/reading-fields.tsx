import type { ReadingStep, Step } from '@shared/schema';
import { Select } from '../../../../components/ui/field';
import { BandsEditor } from './bands-editor';
import { LimitsFields, MeterFields, QuantityUnit, unitFactor } from './measure-fields';
import { TargetSelect } from './target-select';

/** Quantity, unit, limits, meter, decision rule and bands of a Reading. */
export function ReadingFields({ step, stepIds, readOnly, onChange }: { step: ReadingStep; stepIds: string[]; readOnly: boolean; onChange: (s: Step) => void }) {
  const factor = unitFactor(step.quantity, step.unit);
  const set = (patch: Partial<ReadingStep>) => {
    const next = { ...step, ...patch };
    if ('limits' in patch && patch.limits === undefined) delete next.limits;
    if ('meter' in patch && patch.meter === undefined) delete next.meter;
    onChange(next);
  };
  return (
    <div className="flex flex-col gap-3">
      <fieldset disabled={readOnly} className="flex flex-col gap-3">
        <QuantityUnit quantity={step.quantity} unit={step.unit} readingOnly onChange={(v) => set(v as Partial<ReadingStep>)} />
        <LimitsFields limits={step.limits} factor={factor} unit={step.unit} onChange={(limits) => set({ limits })} />
        <MeterFields meter={step.meter} factor={factor} unit={step.unit} onChange={(meter) => set({ meter })} />
        <label className="flex flex-col gap-1 font-semibold">Decision rule
          <Select value={step.decision} onChange={(e) => set({ decision: e.target.value as ReadingStep['decision'] })}>
            <option value="simple">Simple acceptance (the limit decides)</option>
            <option value="guarded">Guarded acceptance (meter uncertainty counts)</option>
          </Select>
        </label>
        <label className="flex flex-col gap-1 font-semibold">When a reading is borderline
          <Select value={step.borderline.action} onChange={(e) => set({ borderline: e.target.value === 'branch' ? { action: 'branch', next: '_unconnected', label: 'Borderline' } : { action: 're-measure', attempts: 1 } })}>
            <option value="re-measure">Measure again</option>
            <option value="branch">Take a branch of its own</option>
          </Select>
        </label>
        {step.borderline.action === 'branch' && (
          <TargetSelect label="Borderline goes to" value={step.borderline.next} stepIds={stepIds}
            onChange={(next) => set({ borderline: { action: 'branch', next, label: step.borderline.action === 'branch' ? step.borderline.label : 'Borderline' } })} />
        )}
        <label className="flex items-center gap-2"><input type="checkbox" checked={step.leadNull} onChange={(e) => set({ leadNull: e.target.checked })} /> Offer test-lead nulling</label>
      </fieldset>
      <BandsEditor bands={step.bands} factor={factor} quantity={step.quantity} unit={step.unit} stepIds={stepIds} disabled={readOnly} onChange={(bands) => set({ bands })} />
    </div>
  );
}

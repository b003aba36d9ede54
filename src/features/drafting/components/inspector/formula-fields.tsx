import { useState } from 'react';
import { evaluateFormula, parseFormula, type FormulaValue, type Quantity } from '@shared/measure';
import { formulaStepSchema, type FormulaStep, type ProcedureDocument, type Step } from '@shared/schema';
import { Field, Input } from '../../../../components/ui/field';
import { BandsEditor } from './bands-editor';
import { QuantityUnit, unitFactor } from './measure-fields';
import { NumberInput } from './number-input';
import { TargetSelect } from './target-select';
import { useStepForm } from './use-step-form';
import { useFormat } from '../../../../lib/format';

const exprSchema = formulaStepSchema.pick({ expression: true });
const pickExpr = (s: Step) => ({ expression: s.kind === 'formula' ? s.expression : '' });

/** Sample values for the steps a formula names, and the result the shared evaluator gives. */
function LiveEvaluation({ step, doc }: { step: FormulaStep; doc: ProcedureDocument }) {
  const [samples, setSamples] = useState<Record<string, number>>({});
  const fmt = useFormat();
  const parsed = parseFormula(step.expression);
  if (!parsed.ok) return <p role="status" className="text-sm text-stop">{parsed.error.message}</p>;
  const values: Record<string, FormulaValue> = {};
  const inputs = parsed.references.map((ref) => {
    const source = doc.steps.find((s) => s.id === ref);
    const quantity: Quantity | null = source && (source.kind === 'reading' || source.kind === 'formula') ? source.quantity : null;
    if (quantity) values[ref] = { value: samples[ref] ?? 1, quantity };
    return { ref, quantity, unit: source && 'unit' in source ? source.unit : '' };
  });
  const result = evaluateFormula(step.expression, values, { expect: step.quantity });
  return (
    <div className="flex flex-col gap-1 rounded-lg bg-paper p-2 text-sm" data-testid="formula-live">
      <span className="font-semibold">Try it with sample values</span>
      {inputs.map(({ ref, quantity, unit }) => quantity
        ? <label key={ref} className="flex items-center gap-2"><code className="w-28 truncate">{ref}</code>
          <NumberInput label={`Sample value of ${ref}`} value={samples[ref] ?? 1} factor={unitFactor(quantity, unit)} onCommit={(v) => setSamples({ ...samples, [ref]: v ?? 0 })} /> {unit}</label>
        : <p key={ref} className="text-stop"><code>{ref}</code> is not a Reading or Formula of this procedure.</p>)}
      <p role="status" className={result.ok ? 'font-semibold text-go' : 'text-stop'}>
        {result.ok ? `= ${fmt.reading({ value: result.value, quantity: step.quantity }, { unit: step.unit })}` : result.error.message}
      </p>
    </div>
  );
}

/** Expression, result quantity and routing of a Formula. */
export function FormulaFields({ step, doc, stepIds, readOnly, onChange }: { step: FormulaStep; doc: ProcedureDocument; stepIds: string[]; readOnly: boolean; onChange: (s: Step) => void }) {
  const form = useStepForm(step, exprSchema, pickExpr, onChange);
  const set = (patch: Partial<FormulaStep>) => onChange({ ...step, ...patch });
  return (
    <div className="flex flex-col gap-3">
      <fieldset disabled={readOnly} className="flex flex-col gap-3">
        <Field label="Expression" hint="Name earlier steps by id, e.g. parallel(primaryOhms, capOhms)" error={form.formState.errors.expression?.message}>
          <Input {...form.register('expression')} className="font-mono" />
        </Field>
        <QuantityUnit quantity={step.quantity} unit={step.unit} readingOnly={false} onChange={(v) => set(v)} />
        {step.bands.length === 0 && <TargetSelect label="Next step" value={step.next ?? '_unconnected'} stepIds={stepIds} onChange={(next) => set({ next })} />}
      </fieldset>
      <LiveEvaluation step={step} doc={doc} />
      <BandsEditor bands={step.bands} factor={unitFactor(step.quantity, step.unit)} quantity={step.quantity} unit={step.unit} stepIds={stepIds} disabled={readOnly} onChange={(bands) => set({ bands })} />
    </div>
  );
}

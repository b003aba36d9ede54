import type { ReadingStep } from '@shared/schema/procedure';
import { limitCrossedBy, type ReadingDecision, type Verdict } from '@shared/measure/verdict';
import { useFormat } from '../../../lib/format';
import { cx } from '../../../components/ui/cx';

const WORDS: Record<Verdict, { label: string; tone: string }> = {
  within: { label: 'Within limits', tone: 'border-go bg-go-soft text-go' },
  below: { label: 'Below limits', tone: 'border-stop bg-stop-soft text-stop' },
  above: { label: 'Above limits', tone: 'border-stop bg-stop-soft text-stop' },
  'borderline-low': { label: 'Borderline — at the lower limit', tone: 'border-edge bg-edge-soft text-edge' },
  'borderline-high': { label: 'Borderline — at the upper limit', tone: 'border-edge bg-edge-soft text-edge' },
};

/** The verdict as soon as the value is valid, with the meter's uncertainty interval. */
export function VerdictPanel({ step, decision, onRemeasure }: { step: ReadingStep; decision: ReadingDecision; onRemeasure(): void }) {
  const fmt = useFormat();
  const f = (v: number) => fmt.reading({ value: v, quantity: step.quantity, significantDigits: 3 });
  const v = decision.verdict ? WORDS[decision.verdict] : null;
  const borderline = decision.verdict === 'borderline-low' || decision.verdict === 'borderline-high';
  const crossed = limitCrossedBy(decision);
  return (
    <div data-testid="verdict" className={cx('rounded-lg border-l-8 p-3 text-ink', v ? v.tone : 'border-line bg-panel')}>
      <p className="text-2xl font-black">{v ? v.label : 'No limits on this step'}</p>
      <p className="text-lg text-ink">
        Value used: <strong>{f(decision.value)}</strong>
        {decision.interval && <> (meter uncertainty: {f(decision.interval.low)} to {f(decision.interval.high)})</>}
      </p>
      {crossed !== null && (
        <div data-testid="crosses-limit" className="mt-2 rounded-lg border-2 border-edge bg-panel p-2">
          <p className="text-lg font-semibold text-ink">
            The meter's uncertainty reaches past the {fmt.limit(crossed, step.quantity, step.unit)} limit; this step decides by the reading itself (simple acceptance), so it stands. Measure again if in doubt.
          </p>
          <button type="button" onClick={onRemeasure} className="mt-2 min-h-12 w-full rounded-lg border-2 border-ink bg-paper px-3 text-lg font-bold">Measure again</button>
        </div>
      )}
      {decision.corrections.leadNull !== undefined && <p className="text-base text-ink">Test leads {f(decision.corrections.leadNull)} subtracted.</p>}
      {borderline && decision.route.kind === 're-measure' && (
        <p className="mt-1 text-lg font-semibold text-ink">Too close to call: clean the contacts, check the meter range, and measure again. Save this reading and enter the new one.</p>
      )}
      {borderline && decision.route.kind === 'borderline-branch' && (
        <p className="mt-1 text-lg font-semibold text-ink">Too close to call: the procedure takes the borderline branch next.</p>
      )}
      {borderline && decision.route.kind === 'band' && (
        <p className="mt-1 text-lg font-semibold text-ink">Still borderline after measuring again: the measured value decides the next step. Note it for the senior technician.</p>
      )}
    </div>
  );
}

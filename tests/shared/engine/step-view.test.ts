import { describe, expect, it } from 'vitest';
import { limitsView, stepView } from '@shared/engine';
import { doc, finding, task } from '../fixtures';

describe('step views', () => {
  it('show limits in the step display unit: a range, a minimum, a maximum, a nominal ± %', () => {
    expect(limitsView({ kind: 'range', min: 0.0006, max: 0.0008 }, 'length', 'mm').text).toBe('0.6 – 0.8 mm');
    expect(limitsView({ kind: 'range', min: 100 }, 'peak-voltage', 'V').text).toBe('at least 100 V');
    expect(limitsView({ kind: 'range', max: 0.5 }, 'resistance', 'Ω').text).toBe('at most 0.5 Ω');
    expect(limitsView({ kind: 'nominal', nominal: 5000, tolerancePercent: 20 }, 'resistance', 'kΩ').text).toBe('5 kΩ ± 20 % (4 – 6 kΩ)');
  });

  it('list safety notes most severe first and ask to acknowledge a DANGER note', () => {
    const d = doc([{ ...task('a', 'f'), safety: [{ signal: 'CAUTION', text: 'Moving parts.' }, { signal: 'DANGER', text: 'Tens of kilovolts.' }] } as never, finding('f')]);
    const v = stepView(d, d.steps[0]!);
    expect(v.safety.map((n) => n.signal)).toEqual(['DANGER', 'CAUTION']);
    expect(v.mustAcknowledge).toBe(true);
  });
});

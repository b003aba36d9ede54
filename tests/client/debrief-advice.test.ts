import { describe, expect, it } from 'vitest';
import type { AdvisorChain } from '@shared/stats/debrief-schema';
import { adviceSummary, byTimeToWin, savedOverall } from '../../src/features/debrief/lib/advice';
import { formatDuration } from '../../src/features/debrief/lib/format';

// Invented demo figures; the expected sums are plain arithmetic worked by hand beside each check.
function chain(id: string, entered: number, currentSeconds: number, proposedSeconds: number): AdvisorChain {
  return { checks: [id], tail: 'x', entered, current: [], proposed: [], currentSeconds, proposedSeconds, changes: proposedSeconds < currentSeconds };
}
const inOrder = chain('kill', 68, 306, 306);
const small = chain('coil', 17, 338, 332); // 6 s × 17 = 102 s
const big = chain('exciter', 13, 567, 364); // 203 s × 13 = 2 639 s = 43 min 59 s
const alsoInOrder = chain('cap', 31, 385, 385);

describe('the check-order advisor reads best with the most time to win first', () => {
  it('counts the time a better order would have saved over every diagnosis that entered the chain', () => {
    expect(savedOverall(small)).toBe(102);
    expect(savedOverall(big)).toBe(2639);
    expect(savedOverall(inOrder)).toBe(0);
  });

  it('puts the chain with the most time to win first, and chains already in order after, busiest first', () => {
    expect(byTimeToWin([inOrder, alsoInOrder, small, big]).map((c) => c.checks[0])).toEqual(['exciter', 'coil', 'kill', 'cap']);
  });

  it('sums what could be won in one sentence, and says so when nothing can', () => {
    expect(adviceSummary([inOrder, alsoInOrder, small, big], formatDuration)).toBe('2 of 4 chains could go faster: about 45 min 41 s over the recorded diagnoses.'); // 102 + 2 639 = 2 741 s
    expect(adviceSummary([inOrder], formatDuration)).toBe('Every chain is already in the best order for the recorded diagnoses.');
    expect(adviceSummary([], formatDuration)).toBe('');
  });
});

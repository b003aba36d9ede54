import type { AdvisorChain } from '@shared/stats/debrief-schema';

/** Time a better order would have saved over the recorded diagnoses that entered a chain (seconds). */
export function savedOverall(chain: AdvisorChain): number {
  return chain.changes ? Math.max(0, chain.currentSeconds - chain.proposedSeconds) * chain.entered : 0;
}

/**
 * Chains in the order a trainer should read them: the most shop time to win first, then the
 * chains most diagnoses pass through. Example: a chain saving 3 min for 13 diagnoses (39 min)
 * comes before one saving 6 s for 17 (under 2 min), and both before chains already in order.
 */
export function byTimeToWin(chains: readonly AdvisorChain[]): AdvisorChain[] {
  return [...chains].sort((a, b) => savedOverall(b) - savedOverall(a) || b.entered - a.entered);
}

/** The sentence above the chains. Example: '2 of 4 chains could go faster: about 41 min over the recorded diagnoses.' */
export function adviceSummary(chains: readonly AdvisorChain[], format: (seconds: number) => string): string {
  const better = chains.filter((c) => savedOverall(c) > 0);
  if (chains.length === 0) return '';
  if (better.length === 0) return `Every chain is already in the best order for the recorded diagnoses.`;
  const total = better.reduce((sum, c) => sum + savedOverall(c), 0);
  return `${better.length} of ${chains.length} ${chains.length === 1 ? 'chain' : 'chains'} could go faster: about ${format(total)} over the recorded diagnoses.`;
}

import { useMemo } from 'react';
import { useFormat } from '../../../lib/format';
import { debriefFormat, type DebriefFormat } from '../lib/format';

/** Debrief's counts, shares, minutes, readings and dates in the shop's locale. */
export function useDebriefFormat(): DebriefFormat {
  const fmt = useFormat();
  return useMemo(() => debriefFormat(fmt), [fmt]);
}

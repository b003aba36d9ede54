import { useSearchParams } from 'react-router-dom';
import type { DiagnosisListQuery } from '@shared/stats/debrief-schema';

const KEYS = ['procedureId', 'versionId', 'status', 'technicianId', 'vehicle', 'flag', 'endingStepId', 'from', 'to', 'sort', 'dir', 'page', 'pageSize'] as const;

/** The table's filters, sort and page live in the URL, so a view can be shared and survives a reload. */
export function useDiagnosisFilters(): [Partial<DiagnosisListQuery>, (patch: Partial<Record<(typeof KEYS)[number], string | number | undefined>>) => void] {
  const [params, setParams] = useSearchParams();
  const q: Record<string, string | number> = {};
  for (const k of KEYS) {
    const v = params.get(k);
    if (v) q[k] = k === 'page' || k === 'pageSize' ? Number(v) : v;
  }
  const update = (patch: Partial<Record<(typeof KEYS)[number], string | number | undefined>>) => {
    const next = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, String(v));
    }
    if (!('page' in patch)) next.delete('page');
    setParams(next, { replace: true });
  };
  return [q as Partial<DiagnosisListQuery>, update];
}

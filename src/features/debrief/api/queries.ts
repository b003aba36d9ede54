import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api, qs } from '../../../lib/api-client';
import type {
  AdvisorAnswer, AnalyticsQuery, DiagnosisListQuery, DiagnosisPage, FindingsAnalytics, ReadingsAnalytics, StepsAnalytics, TimesAnalytics,
} from '@shared/stats/debrief-schema';
import type { DebriefProcedure, Replay } from './types';

/** Query keys and fetchers of Debrief; every component and invalidation goes through these. */
export const debriefKeys = {
  all: ['debrief'] as const,
  procedures: () => [...debriefKeys.all, 'procedures'] as const,
  technicians: () => [...debriefKeys.all, 'technicians'] as const,
  diagnoses: (q: Partial<DiagnosisListQuery>) => [...debriefKeys.all, 'diagnoses', q] as const,
  diagnosis: (id: string) => [...debriefKeys.all, 'diagnosis', id] as const,
  analytics: (what: string, q: AnalyticsQuery) => [...debriefKeys.all, 'analytics', what, q] as const,
};

export const debriefQueries = {
  procedures: () => queryOptions({
    queryKey: debriefKeys.procedures(),
    queryFn: () => api.get<DebriefProcedure[]>('/api/debrief/procedures'),
    staleTime: 60_000,
  }),
  technicians: () => queryOptions({
    queryKey: debriefKeys.technicians(),
    queryFn: () => api.get<{ id: string; name: string }[]>('/api/debrief/technicians'),
    staleTime: 5 * 60_000,
  }),
  diagnoses: (q: Partial<DiagnosisListQuery>) => queryOptions({
    queryKey: debriefKeys.diagnoses(q),
    queryFn: () => api.get<DiagnosisPage>(`/api/debrief/diagnoses${qs(q)}`),
    placeholderData: keepPreviousData,
  }),
  diagnosis: (id: string) => queryOptions({
    queryKey: debriefKeys.diagnosis(id),
    queryFn: () => api.get<Replay>(`/api/debrief/diagnoses/${id}`),
  }),
  steps: (q: AnalyticsQuery) => analytics<StepsAnalytics>('steps', q),
  findings: (q: AnalyticsQuery) => analytics<FindingsAnalytics>('findings', q),
  readings: (q: AnalyticsQuery) => analytics<ReadingsAnalytics>('readings', q),
  times: (q: AnalyticsQuery) => analytics<TimesAnalytics>('times', q),
  advisor: (q: AnalyticsQuery) => analytics<AdvisorAnswer>('advisor', q),
};

function analytics<T>(what: string, q: AnalyticsQuery) {
  return queryOptions({
    queryKey: debriefKeys.analytics(what, q),
    queryFn: () => api.get<T>(`/api/debrief/analytics/${what}${qs(q)}`),
    staleTime: 60_000,
  });
}

/** The CSV export of the filtered diagnoses: a plain link, so the browser downloads it. */
export function diagnosesCsvUrl(q: Partial<DiagnosisListQuery>): string {
  const { page: _page, pageSize: _size, ...filter } = q;
  return `/api/debrief/diagnoses.csv${qs(filter)}`;
}

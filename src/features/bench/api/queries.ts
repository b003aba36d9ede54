import { queryOptions } from '@tanstack/react-query';
import { api, qs } from '../../../lib/api-client';
import type { BenchProcedure, DiagnosisRecord, DiagnosisSummary, Meter, Vehicle } from './types';

/** Every Bench query key and fetcher, in one place. */
export const benchQueries = {
  all: ['bench'] as const,
  procedures: (f: { symptom?: string; ignitionSystem?: string } = {}) => queryOptions({
    queryKey: [...benchQueries.all, 'procedures', f] as const,
    queryFn: () => api.get<BenchProcedure[]>(`/api/bench/procedures${qs(f)}`),
  }),
  vehicles: () => queryOptions({ queryKey: [...benchQueries.all, 'vehicles'] as const, queryFn: () => api.get<Vehicle[]>('/api/vehicles') }),
  meters: () => queryOptions({ queryKey: [...benchQueries.all, 'meters'] as const, queryFn: () => api.get<Meter[]>('/api/shop/meters') }),
  diagnoses: (status?: string) => queryOptions({
    queryKey: [...benchQueries.all, 'diagnoses', status ?? 'all'] as const,
    queryFn: () => api.get<DiagnosisSummary[]>(`/api/diagnoses${qs({ status, mine: 1 })}`),
  }),
  record: (id: string) => queryOptions({
    queryKey: [...benchQueries.all, 'record', id] as const,
    queryFn: () => api.get<DiagnosisRecord>(`/api/diagnoses/${id}`),
  }),
};

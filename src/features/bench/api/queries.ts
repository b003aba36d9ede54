import { queryOptions } from '@tanstack/react-query';
import { api, qs } from '../../../lib/api-client';
import { keptOnPhone } from '../lib/kit';
import type { BenchProcedure, DiagnosisRecord, DiagnosisSummary } from '@shared/schema/bench';
import type { MeterDto } from '@shared/schema/shop';
import type { VehicleDto } from '@shared/schema/vehicle';

/** Every Bench query key and fetcher, in one place. */
export const benchQueries = {
  all: ['bench'] as const,
  /** Every published procedure (filtered on the phone), kept for starting without signal. */
  procedures: () => queryOptions({
    queryKey: [...benchQueries.all, 'procedures'] as const,
    queryFn: () => keptOnPhone('procedures', () => api.get<BenchProcedure[]>('/api/bench/procedures')),
  }),
  vehicles: () => queryOptions({
    queryKey: [...benchQueries.all, 'vehicles'] as const,
    queryFn: () => keptOnPhone('vehicles', () => api.get<VehicleDto[]>('/api/vehicles')),
  }),
  meters: () => queryOptions({
    queryKey: [...benchQueries.all, 'meters'] as const,
    queryFn: () => keptOnPhone('meters', () => api.get<MeterDto[]>('/api/shop/meters')),
  }),
  diagnoses: (status?: string) => queryOptions({
    queryKey: [...benchQueries.all, 'diagnoses', status ?? 'all'] as const,
    queryFn: () => api.get<DiagnosisSummary[]>(`/api/diagnoses${qs({ status, mine: 1 })}`),
  }),
  record: (id: string) => queryOptions({
    queryKey: [...benchQueries.all, 'record', id] as const,
    queryFn: () => api.get<DiagnosisRecord>(`/api/diagnoses/${id}`),
  }),
};

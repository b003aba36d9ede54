import { api } from '../../../lib/api-client';
import type { ProcedureMeta } from '@shared/schema';

// Procedure-level writes: create, duplicate, archive, import, start a draft.

export interface Created { procedureId: string; draftId: string }

export const createProcedure = (meta: ProcedureMeta) => api.post<Created>('/api/procedures', { meta });
export const duplicateProcedure = (id: string) => api.post<Created>(`/api/procedures/${id}/duplicate`, {});
export const archiveProcedure = (id: string, archived: boolean) => api.post<{ archived: boolean }>(`/api/procedures/${id}/archive`, { archived });
export const importProcedure = (file: unknown, title?: string) =>
  api.post<Created & { upgradedFrom: number }>('/api/procedures/import', { file, ...(title ? { title } : {}) });

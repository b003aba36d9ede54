import { queryOptions } from '@tanstack/react-query';
import { api, qs } from '../../../lib/api-client';
import type { ListFilter, ProcedureDetail, ProcedureRow, ReviewComment, VersionDetail } from './types';

export const draftingKeys = {
  all: ['drafting'] as const,
  lists: () => [...draftingKeys.all, 'list'] as const,
  list: (f: ListFilter) => [...draftingKeys.lists(), f] as const,
  procedure: (id: string) => [...draftingKeys.all, 'procedure', id] as const,
  version: (procedureId: string, versionId: string) => [...draftingKeys.procedure(procedureId), 'version', versionId] as const,
  comments: (procedureId: string, versionId: string) => [...draftingKeys.version(procedureId, versionId), 'comments'] as const,
};

const base = (procedureId: string) => `/api/procedures/${procedureId}`;
export const versionUrl = (procedureId: string, versionId: string) => `${base(procedureId)}/versions/${versionId}`;

export const draftingQueries = {
  list: (f: ListFilter) => queryOptions({
    queryKey: draftingKeys.list(f),
    queryFn: () => api.get<ProcedureRow[]>(`/api/procedures${qs({ q: f.q, status: f.status === 'any' ? undefined : f.status, archived: f.archived ? 1 : undefined })}`),
  }),
  procedure: (id: string) => queryOptions({ queryKey: draftingKeys.procedure(id), queryFn: () => api.get<ProcedureDetail>(base(id)) }),
  version: (procedureId: string, versionId: string) => queryOptions({
    queryKey: draftingKeys.version(procedureId, versionId),
    queryFn: () => api.get<VersionDetail>(versionUrl(procedureId, versionId)),
    // the editor holds its own copy; a background refetch must not replace unsaved work
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  }),
  comments: (procedureId: string, versionId: string) => queryOptions({
    queryKey: draftingKeys.comments(procedureId, versionId),
    queryFn: () => api.get<ReviewComment[]>(`${versionUrl(procedureId, versionId)}/comments`),
  }),
};

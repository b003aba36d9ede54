import { api } from '../../../lib/api-client';
import type { ProcedureDocument } from '@shared/schema';
import { versionUrl } from './queries';
import type { ReviewComment, VersionDetail } from './types';

// Version-level writes: save (optimistic lock), the review moves, comments.

export interface VersionIds { procedureId: string; versionId: string }

export const saveDraft = (ids: VersionIds, document: ProcedureDocument, lockVersion: number) =>
  api.put<VersionDetail>(versionUrl(ids.procedureId, ids.versionId), { document, lockVersion });

export type Move = 'submit' | 'take-back' | 'send-back' | 'publish' | 'retire';
export const moveVersion = (ids: VersionIds, move: Move, comment?: string) =>
  api.post<VersionDetail>(`${versionUrl(ids.procedureId, ids.versionId)}/${move}`, comment ? { comment } : {});

export const startDraft = (procedureId: string, fromVersionId?: string) =>
  api.post<VersionDetail>(`/api/procedures/${procedureId}/drafts`, fromVersionId ? { fromVersionId } : {});

export const addComment = (ids: VersionIds, body: string, stepId?: string) =>
  api.post<ReviewComment>(`${versionUrl(ids.procedureId, ids.versionId)}/comments`, { body, ...(stepId ? { stepId } : {}) });

export const exportUrl = (ids: VersionIds) => `${versionUrl(ids.procedureId, ids.versionId)}/export`;

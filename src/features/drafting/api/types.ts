import type { LintFinding } from '@shared/engine';
import type { ProcedureDocument } from '@shared/schema';

// Shapes of the Drafting API answers (server/services/procedure*.ts).

export type VersionStatus = 'draft' | 'in_review' | 'published' | 'retired';

export interface ProcedureRow {
  id: string; slug: string; title: string; symptom: string; ignitionSystem: string; archived: boolean;
  draft: { id: string; status: 'draft' | 'in_review'; lockVersion: number } | null;
  published: { id: string; number: number; publishedAt: string | null } | null;
  lastEditedBy: string | null; lastEditedAt: string; diagnoses: number;
}

export interface VersionSummary {
  id: string; procedureId: string; number: number | null; status: VersionStatus; lockVersion: number;
  basedOnId: string | null; updatedAt: string; updatedBy: string | null; publishedAt: string | null;
  publishedBy: string | null; retiredAt: string | null; errors: number; warnings: number;
}

export interface ProcedureDetail {
  id: string; slug: string; title: string; symptom: string; ignitionSystem: string; archived: boolean;
  versions: VersionSummary[];
}

export interface VersionDetail extends VersionSummary {
  document: ProcedureDocument;
  lintReport: LintFinding[];
}

export interface ReviewComment { id: string; author: string | null; stepId: string | null; body: string; createdAt: string }

export interface ListFilter { q: string; status: 'any' | 'draft' | 'in_review' | 'published' | 'unpublished'; archived: boolean }

/** The 409 a stale save answers with. */
export interface StaleSave { changedBy: string; changedAt: string; lockVersion: number }

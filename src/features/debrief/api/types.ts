import type { ProcedureDocument } from '@shared/schema';
import type { DiagnosisRow } from '@shared/stats/debrief-schema';

// Answers of the Debrief endpoints that are shaped on the server (see server/services/debrief-*.ts).

export interface DebriefProcedure {
  id: string;
  slug: string;
  title: string;
  diagnoses: number;
  versions: { id: string; number: number; status: string; publishedAt: string | null; diagnoses: number }[];
  document: ProcedureDocument;
}

export interface ReplayStep {
  id: string;
  seq: number;
  stepId: string;
  kind: string;
  shown: Record<string, unknown>;
  entered: string | null;
  value: number | null;
  unit: string | null;
  verdict: string | null;
  bandId: string | null;
  answerId: string | null;
  superseded: boolean;
  note: string;
  startedAt: string;
  answeredAt: string;
  seconds: number;
}

export interface CoachingNote { id: string; diagnosisId: string; stepId: string | null; authorName: string; body: string; createdAt: string }

export interface Replay {
  diagnosis: DiagnosisRow & { complaint: string; conditions: Record<string, unknown>; outcome: Record<string, unknown> | null };
  document: ProcedureDocument;
  steps: ReplayStep[];
  path: string[];
  photos: { id: string; stepId: string | null; contentType: string; createdAt: string }[];
  notes: CoachingNote[];
}

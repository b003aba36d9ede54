import type { ProcedureDocument } from '../schema';
import type { StepShown } from '../schema/bench';
import type { DiagnosisRow } from './debrief-schema';

// Shapes of the Debrief answers, written by server/services/debrief-*.ts and read by the client.

export interface DebriefProcedure {
  id: string;
  slug: string;
  title: string;
  diagnoses: number;
  versions: { id: string; number: number; status: string; publishedAt: string | null; diagnoses: number }[];
  /** The latest numbered version's document, for the graph and the step names. */
  document: ProcedureDocument;
}

export interface ReplayStep {
  id: string;
  seq: number;
  stepId: string;
  kind: string;
  /** What the Bench showed at the step, as the step endpoint recorded it (the Bench contract). */
  shown: StepShown;
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

export interface CoachingNoteDto { id: string; diagnosisId: string; stepId: string | null; authorName: string; body: string; createdAt: string }

export interface Replay {
  diagnosis: DiagnosisRow & { complaint: string; conditions: Record<string, unknown>; outcome: Record<string, unknown> | null };
  document: ProcedureDocument;
  steps: ReplayStep[];
  /** Step ids on the path taken (superseded answers left out), ending included. */
  path: string[];
  photos: { id: string; stepId: string | null; contentType: string; createdAt: string }[];
  notes: CoachingNoteDto[];
}

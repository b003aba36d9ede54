import { z } from 'zod';

/** Inputs and answers of the Debrief API, shared by the server routes and the Debrief screens. */

export const DIAGNOSIS_STATUSES = ['active', 'finished', 'handed_off', 'abandoned'] as const;
export type DiagnosisStatus = (typeof DIAGNOSIS_STATUSES)[number];
export const DIAGNOSIS_FLAGS = ['borderline', 'taken-back', 'comeback'] as const;
export type DiagnosisFlag = (typeof DIAGNOSIS_FLAGS)[number];
export const DIAGNOSIS_SORTS = ['startedAt', 'duration', 'status', 'procedure', 'vehicle', 'technician'] as const;

const uuid = z.string().regex(/^[0-9a-f-]{36}$/i, 'Pick one from the list');
/** A calendar day: the shape alone would let 2026-02-30 or 9999-99-99 through to the date arithmetic. */
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-11-30')
  .refine((d) => { const t = Date.parse(`${d}T00:00:00Z`); return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === d; }, 'There is no such day: use a date like 2026-11-30');

/** Filters of the diagnoses table (query string). Dates are whole days, `to` inclusive. */
export const diagnosisFilterSchema = z.object({
  procedureId: uuid.optional(),
  versionId: uuid.optional(),
  status: z.enum(DIAGNOSIS_STATUSES).optional(),
  technicianId: uuid.optional(),
  vehicle: z.string().trim().max(60).optional(),
  flag: z.enum(DIAGNOSIS_FLAGS).optional(),
  endingStepId: z.string().max(64).optional(),
  from: day.optional(),
  to: day.optional(),
});
export type DiagnosisFilter = z.infer<typeof diagnosisFilterSchema>;

export const diagnosisListQuerySchema = diagnosisFilterSchema.extend({
  sort: z.enum(DIAGNOSIS_SORTS).default('startedAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type DiagnosisListQuery = z.infer<typeof diagnosisListQuerySchema>;

export interface DiagnosisRow {
  id: string;
  procedureId: string;
  procedureTitle: string;
  versionId: string;
  versionNumber: number | null;
  vehicleLabel: string;
  vehicleModel: string;
  technicianId: string;
  technicianName: string;
  status: DiagnosisStatus;
  endingStepId: string | null;
  endingTitle: string | null;
  endingKind: string | null;
  startedAt: string;
  endedAt: string | null;
  durationSeconds: number;
  flags: { borderline: boolean; takenBack: boolean; comeback: boolean };
}

export interface DiagnosisPage { rows: DiagnosisRow[]; total: number; page: number; pageSize: number; comebackDays: number }

/** Scope of the analytics: one procedure, optionally one version, over whole days. */
export const analyticsQuerySchema = z.object({
  procedureId: uuid,
  versionId: uuid.optional(),
  from: day.optional(),
  to: day.optional(),
});
export type AnalyticsQuery = z.infer<typeof analyticsQuerySchema>;

export const coachingNoteBodySchema = z.object({
  body: z.string().trim().min(1, 'Write the note first').max(4000, 'Keep a note under 4000 characters'),
  stepId: z.string().regex(/^[A-Za-z_][A-Za-z0-9_]{0,63}$/, 'Pick a step of this diagnosis').nullish(),
});
export type CoachingNoteBody = z.infer<typeof coachingNoteBodySchema>;

export const advisorDraftBodySchema = z.object({
  versionId: uuid,
  /** The chain's checks in the proposed order. */
  order: z.array(z.string().max(64)).min(2).max(50),
});
export type AdvisorDraftBody = z.infer<typeof advisorDraftBodySchema>;

export interface Quart { n: number; q1: number | null; median: number | null; q3: number | null }

export interface StepFigure { stepId: string; reached: number; finished: number; handedOff: number; abandoned: number; active: number }
export interface BranchFigure { from: string; handle: string; count: number; share: number }
export interface StepsAnalytics { diagnoses: number; steps: StepFigure[]; branches: BranchFigure[] }

export interface EndingFigure { stepId: string; status: DiagnosisStatus; count: number; share: number }
export interface FindingsAnalytics {
  ended: number;
  endings: EndingFigure[];
  firstTimeFix: { finished: number; comebacks: number; rate: number | null; comebackDays: number };
}

export interface ReadingFigure {
  stepId: string;
  /** The quantity of the step (values and bins are in its base unit) and its display unit. */
  quantity: string | null;
  unit: string | null;
  /** The step's limits in base units (of the version drawn). */
  limits: { min?: number; max?: number };
  n: number;
  borderline: number;
  borderlineShare: number | null;
  bins: { lo: number; hi: number; count: number }[];
  byTechnician: ({ technicianId: string; technicianName: string; borderline: number } & Quart)[];
}
export interface ReadingsAnalytics { readings: ReadingFigure[] }

export interface TimesAnalytics {
  definition: string;
  steps: ({ stepId: string } & Quart)[];
  diagnosis: Quart;
}

export interface AdvisorCheck { stepId: string; reached: number; revealed: number; revealShare: number; seconds: number; secondsFrom: 'recorded' | 'estimate' }
export interface AdvisorChain {
  checks: string[];
  tail: string;
  entered: number;
  current: AdvisorCheck[];
  proposed: AdvisorCheck[];
  currentSeconds: number;
  proposedSeconds: number;
  changes: boolean;
}
export interface AdvisorAnswer { versionId: string; chains: AdvisorChain[] }

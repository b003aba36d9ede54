import { z } from 'zod';
import { STEP_KINDS, partSchema, quantitySchema, safetyNoteSchema, stepIdSchema } from './procedure';
import { procedureDocumentSchema } from './procedure';
import { MeterSpecEntrySchema } from './shop';

// The Bench contract: what the phone sends to start a diagnosis and record its steps, and what the
// server answers for start, step, the lists and the record. The server parses its inputs with these
// schemas and types its answers with the inferred types; the phone imports the types only (so the
// schema library stays out of its first download); tests/server/bench-contract.test.ts parses real
// answers of the API with the answer schemas.

// ── Inputs ─────────────────────────────────────────────────────────────────────────────────────

// Ids are generated on the phone (crypto.randomUUID) so that a message the outbox sends twice is
// stored once.
const uuid = z.string().uuid('Use the id the app generated (a UUID)');
const isoTime = z.string().datetime({ offset: true, message: 'Send the time as an ISO 8601 timestamp' });

export const ConditionsInput = z.object({
  engine: z.enum(['hot', 'cold'], 'Say whether the engine is hot or cold'),
  ambientC: z.number().min(-40, 'At least -40 °C').max(60, 'At most 60 °C'),
  startingMethod: z.enum(['kick', 'pull', 'electric', 'push'], 'Pick how the engine is started'),
  batteryVolts: z.number().min(0).max(30, 'At most 30 V').nullable().default(null),
});
export type Conditions = z.infer<typeof ConditionsInput>;

/** Body of `POST /api/diagnoses`. */
export const StartDiagnosisInput = z.object({
  id: uuid,
  procedureVersionId: uuid,
  vehicleId: uuid,
  meterId: uuid.nullable().default(null),
  complaint: z.string().trim().min(1, "Write the complaint in the customer's words").max(2000),
  conditions: ConditionsInput,
  startedAt: isoTime,
});
export type StartDiagnosisInput = z.infer<typeof StartDiagnosisInput>;
/** What the phone sends to start (defaults may be left out). */
export type StartDiagnosisBody = z.input<typeof StartDiagnosisInput>;

export const FindingOutcomeInput = z.object({
  partsFitted: z.array(z.object({
    name: z.string().trim().min(1, 'Name the part').max(120),
    lot: z.string().trim().max(60).default(''),
  })).max(30).default([]),
  finalCheck: z.object({ spark: z.boolean(), runs: z.boolean(), stops: z.boolean() }),
  labourMinutes: z.number().int('Whole minutes').min(0).max(24 * 60),
});
export type FindingOutcome = z.infer<typeof FindingOutcomeInput>;
export const HandoffOutcomeInput = z.object({
  reason: z.string().trim().min(1, 'Say why you hand the machine on').max(2000),
});
export type HandoffOutcome = z.infer<typeof HandoffOutcomeInput>;
/** What the phone sends with the step that ends the diagnosis: a Finding's or a Hand-off's outcome. */
export type EndingOutcome = z.input<typeof FindingOutcomeInput> | z.input<typeof HandoffOutcomeInput>;

/** Body of `POST /api/diagnoses/:id/steps`: one answered step, linked after the one it follows. */
export const DiagnosisStepInput = z.object({
  id: uuid,
  /** The answered step this one follows on the path, or null for the start step. */
  after: uuid.nullable(),
  stepId: stepIdSchema,
  entered: z.string().max(64).optional(),
  /** The test-lead reading typed for a low-ohm step. */
  leadEntered: z.string().max(64).optional(),
  answerId: z.string().max(40).optional(),
  note: z.string().max(4000).default(''),
  /** The technician acknowledged the step's DANGER note. */
  acknowledged: z.boolean().default(false),
  /** When the DANGER note was acknowledged, as the phone's clock said; kept in the record. */
  acknowledgedAt: isoTime.optional(),
  outcome: z.union([FindingOutcomeInput, HandoffOutcomeInput]).optional(),
  startedAt: isoTime,
  answeredAt: isoTime,
});
export type DiagnosisStepInput = z.infer<typeof DiagnosisStepInput>;
/** What the phone sends for a step and keeps as its row (defaults may be left out). */
export type DiagnosisStepBody = z.input<typeof DiagnosisStepInput>;

export const DIAGNOSIS_STATUSES = ['active', 'finished', 'handed_off', 'abandoned'] as const;
export const diagnosisStatusSchema = z.enum(DIAGNOSIS_STATUSES);
export type DiagnosisStatus = z.infer<typeof diagnosisStatusSchema>;

/** Query of `GET /api/bench/procedures`. */
export const ProcedureListQuery = z.object({
  symptom: z.string().trim().max(200).optional(),
  ignitionSystem: z.string().trim().max(40).optional(),
});

/** Query of `GET /api/diagnoses`. */
export const DiagnosisListQuery = z.object({
  status: diagnosisStatusSchema.optional(),
  mine: z.enum(['0', '1']).default('1'),
});

/** Body of `POST /api/diagnoses/:id/report`. */
export const ReportInput = z.object({
  to: z.string().trim().toLowerCase().email('Enter an e-mail address').optional(),
});

// ── Answers ────────────────────────────────────────────────────────────────────────────────────

const isoString = z.string().datetime({ offset: true });
const branchCountsSchema = z.record(z.string(), z.record(z.string(), z.number().int().min(0)));
export const verdictSchema = z.enum(['within', 'below', 'above', 'borderline-low', 'borderline-high']);

/** One entry of `GET /api/bench/procedures`: the latest published version of a procedure. */
export const BenchProcedure = z.object({
  procedureId: z.string().uuid(), slug: z.string(), title: z.string(), symptom: z.string(), ignitionSystem: z.string(),
  versionId: z.string().uuid(), number: z.number().int(), publishedAt: isoString.nullable(),
});
export type BenchProcedure = z.infer<typeof BenchProcedure>;

/**
 * `GET /api/bench/procedures/:slug` and `/api/bench/versions/:id`: the pinned version a phone keeps
 * to walk offline, its document already upgraded, with the shop's recorded branch counts
 * (step id → branch handle → times taken; empty without history).
 */
export const BenchVersion = z.object({
  id: z.string().uuid(), procedureId: z.string().uuid(), slug: z.string(), title: z.string(), number: z.number().int(),
  document: procedureDocumentSchema,
  branchCounts: branchCountsSchema,
});
export type BenchVersion = z.infer<typeof BenchVersion>;

/** `POST /api/diagnoses`: 201 with `created` when new, 200 when the same start came again. */
export const StartDiagnosisResult = z.object({ created: z.boolean(), id: z.string().uuid() });
export type StartDiagnosisResult = z.infer<typeof StartDiagnosisResult>;

/** `POST /api/diagnoses/:id/steps`: the step as decided and stored (`duplicate` when sent again). */
export const StepResult = z.object({
  id: z.string().uuid(), seq: z.number().int().min(1), stepId: z.string(),
  value: z.number().nullable(), verdict: verdictSchema.nullable(),
  /** The band taken, `'borderline'` for the author's borderline branch, null for no band. */
  bandId: z.string().nullable(), answerId: z.string().nullable(),
  next: z.string().nullable(), status: diagnosisStatusSchema, duplicate: z.boolean(),
});
export type StepResult = z.infer<typeof StepResult>;

/** One entry of `GET /api/diagnoses`. */
export const DiagnosisSummary = z.object({
  id: z.string().uuid(), status: diagnosisStatusSchema, procedureTitle: z.string(), procedureSlug: z.string(),
  versionId: z.string().uuid(), versionNumber: z.number().int(), vehicleLabel: z.string(), vehicleModel: z.string(),
  technicianName: z.string(), complaint: z.string(), startedAt: isoString, endedAt: isoString.nullable(),
  lastActivityAt: isoString, stepsAnswered: z.number().int().min(0), endingStepId: z.string().nullable(),
  /** The title of the step waiting for an answer, while the diagnosis is active (else null). */
  currentStepTitle: z.string().nullable(),
});
export type DiagnosisSummary = z.infer<typeof DiagnosisSummary>;

/**
 * What the screen showed for a step, as the server rebuilt it from the pinned version when the
 * step was recorded (every kind's fields are optional: a record holds all kinds), with the
 * decision of a Reading or Formula and what the technician confirmed.
 */
export const StepShown = z.object({
  title: z.string(),
  instructions: z.string(),
  safety: z.array(safetyNoteSchema),
  quantity: quantitySchema.optional(),
  unit: z.string().optional(),
  limits: z.object({ min: z.number().optional(), max: z.number().optional() }).optional(),
  /** The limits as the step screen showed them (the shared `limitsView` text). */
  limitsText: z.string().optional(),
  question: z.string().optional(),
  answers: z.array(z.object({ id: z.string(), label: z.string() })).optional(),
  confirmLabel: z.string().optional(),
  cause: z.string().optional(),
  repair: z.string().optional(),
  parts: z.array(partSchema).optional(),
  reason: z.string().optional(),
  /** A "Continue in" step: the procedure it went on in (slug and title) and the step it began at. */
  procedure: z.string().optional(),
  procedureTitle: z.string().optional(),
  entry: z.string().optional(),
  interval: z.object({ low: z.number(), high: z.number() }).nullable().optional(),
  corrections: z.object({ leadNull: z.number().optional(), temperatureFactor: z.number().optional() }).optional(),
  route: z.enum(['answered', 're-measure', 'computed', 'ended', 'stuck']).optional(),
  leadEntered: z.string().optional(),
  acknowledged: z.boolean().optional(),
  acknowledgedAt: isoString.optional(),
});
export type StepShown = z.infer<typeof StepShown>;

/** One stored answer in the record, superseded ones (changed later) included. */
export const RecordStep = z.object({
  id: z.string().uuid(), seq: z.number().int().min(1), stepId: z.string(),
  kind: z.enum(STEP_KINDS),
  shown: StepShown, entered: z.string().nullable(), value: z.number().nullable(), unit: z.string().nullable(),
  verdict: verdictSchema.nullable(), bandId: z.string().nullable(), answerId: z.string().nullable(),
  superseded: z.boolean(), note: z.string(), startedAt: isoString, answeredAt: isoString, next: z.string().nullable(),
});
export type RecordStep = z.infer<typeof RecordStep>;

export const RecordAttachment = z.object({
  id: z.string().uuid(), stepId: z.string().nullable(), contentType: z.string(), byteSize: z.number().int(),
  originalName: z.string(), hasThumb: z.boolean(), createdAt: isoString,
});
export const RecordCoachingNote = z.object({
  id: z.string().uuid(), stepId: z.string().nullable(), body: z.string(), authorName: z.string().nullable(), createdAt: isoString,
});

/** `GET /api/diagnoses/:id`: the complete record of one diagnosis. */
export const DiagnosisRecord = DiagnosisSummary.extend({
  conditions: ConditionsInput,
  outcome: z.union([FindingOutcomeInput, HandoffOutcomeInput]).nullable(),
  meterName: z.string().nullable(),
  meterEntries: z.array(MeterSpecEntrySchema),
  vehicleFrameNumber: z.string(),
  vehicleHours: z.number().nullable(),
  steps: z.array(RecordStep),
  attachments: z.array(RecordAttachment),
  coachingNotes: z.array(RecordCoachingNote),
});
export type DiagnosisRecord = z.infer<typeof DiagnosisRecord>;

/** `POST /api/diagnoses/:id/report`. */
export const ReportResult = z.object({ sentTo: z.string() });
export type ReportResult = z.infer<typeof ReportResult>;

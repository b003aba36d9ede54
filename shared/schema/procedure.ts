import { z } from 'zod';
import { QUANTITIES, READING_QUANTITIES, isDisplayUnit } from '../measure/quantities';

/**
 * The procedure document: the graph an author draws in Drafting and a technician walks on the
 * Bench. Branches live inside the steps (a band's `next`, an answer's `next`, a Task's `next`),
 * so a branch can never point from a step that does not exist. Structural rules are enforced
 * here; whether the graph makes sense as a diagnosis (reachability, band coverage, formulas)
 * is the soundness check's job (`lintProcedure`), so that a half-drawn draft still loads.
 *
 * All limit and band values are stored in the quantity's base unit (Ω, V, F, A, °C, m, s, rpm,
 * J); `unit` only says how the step shows them and what a bare typed number means.
 */

export const CURRENT_SCHEMA_VERSION = 2 as const;

/** At most this many reference pictures on one step. */
export const MAX_PICTURES_PER_STEP = 8;

/**
 * A reference picture on a step (where to probe, a connector's pins, a good spark): the id of a
 * stored picture of the shop and its caption, which is also the picture's alt text. The bytes
 * live in object storage; the document keeps the order and the words, so a version's pictures
 * are as immutable as the version. Added in schema version 2.
 */
export const stepPictureSchema = z.object({
  id: z.string().uuid('A picture is named by the id the upload answered'),
  caption: z.string().trim().min(1, 'Say what the picture shows (the caption is also read aloud to those who cannot see it)').max(200),
});
export type StepPicture = z.infer<typeof stepPictureSchema>;

/** Identifier-like so that a Formula can name an earlier step: `parallel(primaryOhms, capOhms)`. */
export const stepIdSchema = z
  .string()
  .regex(/^[A-Za-z_][A-Za-z0-9_]{0,63}$/, 'Use letters, digits and _ only, starting with a letter (at most 64)');
export type StepId = z.infer<typeof stepIdSchema>;

const handleIdSchema = z
  .string()
  .regex(/^[A-Za-z0-9_-]{1,40}$/, 'Use letters, digits, - and _ only (at most 40)');

/** ANSI Z535 / ISO 3864 signal words, most severe first. */
export const SIGNAL_WORDS = ['DANGER', 'WARNING', 'CAUTION', 'NOTICE'] as const;
export const signalWordSchema = z.enum(SIGNAL_WORDS);
export type SignalWord = z.infer<typeof signalWordSchema>;

export const safetyNoteSchema = z.object({
  signal: signalWordSchema,
  text: z.string().trim().min(1, 'Say what the hazard is and how to avoid it').max(600),
});
export type SafetyNote = z.infer<typeof safetyNoteSchema>;

/** What can hurt the technician at this step; each one needs a safety note (soundness check). */
export const HAZARDS = ['high-voltage', 'fuel-vapour', 'moving-parts', 'hot-surface'] as const;
export const hazardSchema = z.enum(HAZARDS);
export type Hazard = z.infer<typeof hazardSchema>;

export const positionSchema = z.object({ x: z.number().finite(), y: z.number().finite() });
export type Position = z.infer<typeof positionSchema>;

export const quantitySchema = z.enum(QUANTITIES);
export const readingQuantitySchema = z.enum(READING_QUANTITIES);

/** Limits in base units: a range (either end may be open) or a nominal value ± percent. */
export const limitsSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('range'), min: z.number().finite().optional(), max: z.number().finite().optional() }),
  z.object({
    kind: z.literal('nominal'),
    nominal: z.number().finite(),
    tolerancePercent: z.number().finite().positive().max(1000),
  }),
]);
export type Limits = z.infer<typeof limitsSchema>;

/** A meter's accuracy as ±(percent of reading + counts), counts at the given resolution (base units). */
export const meterSpecSchema = z.object({
  percentOfReading: z.number().finite().min(0).max(100),
  counts: z.number().int().min(0).max(1000),
  resolution: z.number().finite().positive(),
});
export type MeterSpec = z.infer<typeof meterSpecSchema>;

/** Simple acceptance (the limit decides) or guarded acceptance (ILAC-G8 §4.2.3 zones). */
export const decisionRuleSchema = z.enum(['simple', 'guarded']);
export type DecisionRule = z.infer<typeof decisionRuleSchema>;

/** What the step says when the uncertainty interval straddles a limit. */
export const borderlineActionSchema = z.discriminatedUnion('action', [
  z.object({ action: z.literal('re-measure'), attempts: z.number().int().min(1).max(5).default(1) }),
  z.object({ action: z.literal('branch'), next: stepIdSchema, label: z.string().max(80).default('Borderline') }),
]);
export type BorderlineAction = z.infer<typeof borderlineActionSchema>;

/** One end of a band; a missing end means the band runs on to ±infinity. */
export const bandEndSchema = z.object({ value: z.number().finite(), inclusive: z.boolean() });
export type BandEnd = z.infer<typeof bandEndSchema>;

export const bandSchema = z.object({
  id: handleIdSchema,
  label: z.string().trim().min(1).max(80),
  lower: bandEndSchema.optional(),
  upper: bandEndSchema.optional(),
  next: stepIdSchema,
});
export type Band = z.infer<typeof bandSchema>;

/** Copper-winding correction (IEC 60028) to the limits' reference temperature. */
export const windingCorrectionSchema = z.object({
  material: z.literal('copper'),
  referenceTemperature: z.number().finite().default(20),
  /** The Reading step (quantity temperature) that measured the engine/winding temperature. */
  temperatureStep: stepIdSchema,
});
export type WindingCorrection = z.infer<typeof windingCorrectionSchema>;

const stepBase = {
  id: stepIdSchema,
  title: z.string().trim().min(1).max(120),
  instructions: z.string().max(4000).default(''),
  safety: z.array(safetyNoteSchema).max(10).default([]),
  hazards: z.array(hazardSchema).max(HAZARDS.length).default([]),
  /** Estimated minutes for this step; defaults to the procedure's minutes per step. */
  minutes: z.number().finite().min(0).max(600).optional(),
  position: positionSchema.default({ x: 0, y: 0 }),
  pictures: z.array(stepPictureSchema).max(MAX_PICTURES_PER_STEP, `At most ${MAX_PICTURES_PER_STEP} pictures on one step`).optional(),
};

export const readingStepSchema = z.object({
  ...stepBase,
  kind: z.literal('reading'),
  quantity: readingQuantitySchema,
  unit: z.string().max(8),
  limits: limitsSchema.optional(),
  meter: meterSpecSchema.optional(),
  decision: decisionRuleSchema.default('simple'),
  borderline: borderlineActionSchema.default({ action: 're-measure', attempts: 1 }),
  /** Offer test-lead nulling (low-ohm readings): the lead reading is subtracted. */
  leadNull: z.boolean().default(false),
  winding: windingCorrectionSchema.optional(),
  bands: z.array(bandSchema).max(12).default([]),
});
export type ReadingStep = z.infer<typeof readingStepSchema>;

export const answerSchema = z.object({
  id: handleIdSchema,
  label: z.string().trim().min(1).max(80),
  next: stepIdSchema,
});
export type Answer = z.infer<typeof answerSchema>;

export const observationStepSchema = z.object({
  ...stepBase,
  kind: z.literal('observation'),
  question: z.string().trim().min(1).max(200),
  answers: z.array(answerSchema).max(8),
});
export type ObservationStep = z.infer<typeof observationStepSchema>;

export const taskStepSchema = z.object({
  ...stepBase,
  kind: z.literal('task'),
  confirmLabel: z.string().trim().min(1).max(40).default('Done'),
  next: stepIdSchema.optional(),
});
export type TaskStep = z.infer<typeof taskStepSchema>;

export const formulaStepSchema = z.object({
  ...stepBase,
  kind: z.literal('formula'),
  expression: z.string().trim().min(1).max(500),
  quantity: quantitySchema,
  unit: z.string().max(8),
  limits: limitsSchema.optional(),
  /** Either one `next`, or bands that route by the computed value like a Reading's. */
  next: stepIdSchema.optional(),
  bands: z.array(bandSchema).max(12).default([]),
});
export type FormulaStep = z.infer<typeof formulaStepSchema>;

export const partSchema = z.object({
  name: z.string().trim().min(1).max(120),
  partNumber: z.string().trim().max(60).optional(),
  quantity: z.number().int().min(1).max(100).default(1),
});
export type Part = z.infer<typeof partSchema>;

export const findingStepSchema = z.object({
  ...stepBase,
  kind: z.literal('finding'),
  cause: z.string().trim().min(1).max(600),
  repair: z.string().max(2000).default(''),
  parts: z.array(partSchema).max(30).default([]),
  /**
   * Reached in a procedure that was continued in from another one with a way back, this Finding
   * does not end the diagnosis: it returns to the calling procedure's chosen step.
   */
  returns: z.boolean().default(false),
});
export type FindingStep = z.infer<typeof findingStepSchema>;

export const handoffStepSchema = z.object({
  ...stepBase,
  kind: z.literal('handoff'),
  reason: z.string().trim().min(1).max(600),
});
export type HandoffStep = z.infer<typeof handoffStepSchema>;

/** A procedure of the shop as a link names it: its slug, stable across versions and titles. */
export const procedureSlugSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,79}$/, 'Use the procedure\'s short name: lower-case letters, digits and - (at most 80)');

/**
 * "Continue in": the diagnosis goes on in another published procedure of the shop, at its start
 * or at `entry`, and comes back to `back` in this procedure when the other one reaches a Finding
 * marked `returns` (without `back`, the other procedure's endings end the diagnosis).
 */
export const linkStepSchema = z.object({
  ...stepBase,
  kind: z.literal('link'),
  procedure: procedureSlugSchema,
  /** A step of the other procedure to begin at; its start when left out. */
  entry: stepIdSchema.optional(),
  /** The step of this procedure a returning Finding comes back to. */
  back: stepIdSchema.optional(),
  /**
   * Set only when the other procedure's steps are joined into one walk (`joinLinked`): the first
   * of them. Authors and files leave it out.
   */
  next: stepIdSchema.optional(),
  /** Set with `next` when joined: the other procedure's title, for the screen and the record. */
  procedureTitle: z.string().max(120).optional(),
});
export type LinkStep = z.infer<typeof linkStepSchema>;

export const STEP_KINDS = ['reading', 'observation', 'task', 'formula', 'finding', 'handoff', 'link'] as const;
export type StepKind = (typeof STEP_KINDS)[number];

export const stepSchema = z
  .discriminatedUnion('kind', [
    readingStepSchema,
    observationStepSchema,
    taskStepSchema,
    formulaStepSchema,
    findingStepSchema,
    handoffStepSchema,
    linkStepSchema,
  ])
  .superRefine((step, ctx) => {
    if ((step.kind === 'reading' || step.kind === 'formula') && !isDisplayUnit(step.quantity, step.unit)) {
      ctx.addIssue({
        code: 'custom',
        path: ['unit'],
        message: `"${step.unit}" is not a unit for ${step.quantity}; choose one the quantity offers`,
      });
    }
  });
export type Step = z.infer<typeof stepSchema>;
export type StepInput = z.input<typeof stepSchema>;

export const IGNITION_SYSTEMS = ['magneto-cdi', 'battery-cdi', 'magneto-inductive', 'battery-inductive', 'other'] as const;

export const procedureMetaSchema = z.object({
  title: z.string().trim().min(1).max(120),
  symptom: z.string().trim().min(1).max(200),
  ignitionSystem: z.enum(IGNITION_SYSTEMS),
  appliesTo: z.string().max(1000).default(''),
  /** Default estimate for a step that gives none (Formula steps take no time by default). */
  minutesPerStep: z.number().finite().min(0).max(600).default(2),
  /** Where the limits come from; demo procedures say they are illustrative. */
  limitsNote: z.string().max(600).default(''),
});
export type ProcedureMeta = z.infer<typeof procedureMetaSchema>;

export const procedureDocumentSchema = z.object({
  schemaVersion: z.literal(CURRENT_SCHEMA_VERSION),
  meta: procedureMetaSchema,
  start: stepIdSchema,
  steps: z.array(stepSchema).min(1).max(25_000),
});
/** A procedure document after parsing (defaults filled in). */
export type ProcedureDocument = z.infer<typeof procedureDocumentSchema>;
/** What an author or a file may write: defaults may be left out. */
export type ProcedureDocumentInput = z.input<typeof procedureDocumentSchema>;

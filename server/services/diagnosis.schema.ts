import { z } from 'zod';
import { stepIdSchema } from '@shared/schema/procedure';

// Inputs of the Bench API. Ids are generated on the phone (crypto.randomUUID) so that a message
// the outbox sends twice is stored once.
const uuid = z.string().uuid('Use the id the app generated (a UUID)');
const isoTime = z.string().datetime({ offset: true, message: 'Send the time as an ISO 8601 timestamp' });

export const ConditionsInput = z.object({
  engine: z.enum(['hot', 'cold'], 'Say whether the engine is hot or cold'),
  ambientC: z.number().min(-40, 'At least -40 °C').max(60, 'At most 60 °C'),
  startingMethod: z.enum(['kick', 'pull', 'electric', 'push'], 'Pick how the engine is started'),
  batteryVolts: z.number().min(0).max(30, 'At most 30 V').nullable().default(null),
});

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

export const FindingOutcomeInput = z.object({
  partsFitted: z.array(z.object({
    name: z.string().trim().min(1, 'Name the part').max(120),
    lot: z.string().trim().max(60).default(''),
  })).max(30).default([]),
  finalCheck: z.object({ spark: z.boolean(), runs: z.boolean(), stops: z.boolean() }),
  labourMinutes: z.number().int('Whole minutes').min(0).max(24 * 60),
});
export const HandoffOutcomeInput = z.object({
  reason: z.string().trim().min(1, 'Say why you hand the machine on').max(2000),
});

export const StepInput = z.object({
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
export type StepInput = z.infer<typeof StepInput>;

export const ProcedureListQuery = z.object({
  symptom: z.string().trim().max(200).optional(),
  ignitionSystem: z.string().trim().max(40).optional(),
});

export const DiagnosisListQuery = z.object({
  status: z.enum(['active', 'finished', 'handed_off', 'abandoned']).optional(),
  mine: z.enum(['0', '1']).default('1'),
});

export const ReportInput = z.object({
  to: z.string().trim().toLowerCase().email('Enter an e-mail address').optional(),
});

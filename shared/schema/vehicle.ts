import { z } from 'zod';
import { checkVinDigit } from '../vin';

/**
 * A frame number as typed. 17 characters are taken as a VIN and must carry a valid check digit
 * (49 CFR 565.15); shorter frame numbers are accepted as typed.
 */
export const FrameNumberSchema = z
  .string()
  .trim()
  .max(40, 'A frame number has at most 40 characters')
  .superRefine((value, ctx) => {
    if (value.length !== 17) return;
    const problem = checkVinDigit(value);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });

export const VehicleInput = z.object({
  label: z.string().trim().min(1, 'Give the machine a label, such as its fleet number').max(60),
  model: z.string().trim().max(80).default(''),
  frameNumber: FrameNumberSchema.default(''),
  hours: z.number().min(0, 'Hours cannot be negative').max(100_000).nullable().default(null),
  notes: z.string().max(2000).default(''),
});
export type VehicleInput = z.infer<typeof VehicleInput>;

export const VehicleListQuery = z.object({ q: z.string().trim().max(80).optional() });

export interface VehicleDto {
  id: string; label: string; model: string; frameNumber: string; hours: number | null; notes: string; updatedAt: string;
  /** When the machine's latest diagnosis started (in the list only; null when never diagnosed). */
  lastDiagnosedAt?: string | null;
}

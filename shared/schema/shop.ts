import { z } from 'zod';
import { readingQuantitySchema } from './procedure';

export const ShopSettingsInput = z.object({
  name: z.string().trim().min(1, 'Give the shop a name').max(120),
  settings: z.object({
    comebackDays: z.number().int().min(1, 'At least 1 day').max(365, 'At most 365 days'),
    abandonAfterHours: z.number().min(1, 'At least 1 hour').max(24 * 30, 'At most 30 days'),
    serviceDeskEmail: z.union([z.literal(''), z.string().trim().toLowerCase().email('Enter an e-mail address or leave it empty')]),
  }),
});
export type ShopSettingsInput = z.infer<typeof ShopSettingsInput>;

export const MeterSpecEntrySchema = z.object({
  quantity: readingQuantitySchema,
  percentOfReading: z.number().min(0).max(50),
  counts: z.number().int().min(0).max(1000),
  resolution: z.number().positive(),
});
export const MeterInput = z.object({
  name: z.string().trim().min(1, 'Name the meter, e.g. "Bench meter 2"').max(80),
  spec: z.object({ entries: z.array(MeterSpecEntrySchema).max(20) }),
});
export type MeterInput = z.infer<typeof MeterInput>;

/** A shop meter as `GET /api/shop/meters` lists it. */
export interface MeterDto { id: string; name: string; spec: MeterInput['spec'] }

import { z } from 'zod';
import { readingQuantitySchema } from './procedure';
import { canonicalLocale } from '../format/locale';

/**
 * A shop's locale: a BCP 47 tag the runtime can format for, stored in its canonical form; null
 * (or empty text) follows each device's browser. Example: "de-de" is stored as "de-DE".
 */
export const ShopLocaleSchema = z.string({ error: 'Send the locale as text, such as de-DE, or null to follow each device\'s browser' })
  .max(64, 'Use a language tag of at most 64 characters, such as de-DE').nullable()
  .transform((tag, ctx) => {
    if (tag === null || tag.trim() === '') return null;
    const canonical = canonicalLocale(tag);
    if (canonical) return canonical;
    ctx.addIssue({ code: 'custom', message: `"${tag.slice(0, 64)}" is not a language tag this app can format for. Pick one from the list, or type a BCP 47 tag such as de-DE or en-GB; leave it empty to follow each device's browser.` });
    return z.NEVER;
  });

export const ShopSettingsInput = z.object({
  name: z.string().trim().min(1, 'Give the shop a name').max(120),
  settings: z.object({
    comebackDays: z.number().int().min(1, 'At least 1 day').max(365, 'At most 365 days'),
    abandonAfterHours: z.number().min(1, 'At least 1 hour').max(24 * 30, 'At most 30 days'),
    serviceDeskEmail: z.union([z.literal(''), z.string().trim().toLowerCase().email('Enter an e-mail address or leave it empty')]),
  }),
  /** Left out: the shop's locale stays as it is. */
  locale: ShopLocaleSchema.optional(),
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

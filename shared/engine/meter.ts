import type { ProcedureDocument } from '../schema/procedure';

/** One line of a shop meter's accuracy spec: ±(percentOfReading % + counts) at the resolution. */
export type MeterEntry = { quantity: string; percentOfReading: number; counts: number; resolution: number };

/**
 * Fills in the diagnosis meter's spec on Readings that name none, so the verdict on the phone and
 * the one on record (the server runs the same function) agree.
 * Example: withMeter(doc, [{ quantity: 'resistance', percentOfReading: 0.9, counts: 2, resolution: 0.1 }])
 */
export function withMeter(doc: ProcedureDocument, entries: readonly MeterEntry[]): ProcedureDocument {
  if (!entries.length) return doc;
  const steps = doc.steps.map((s) => {
    if (s.kind !== 'reading' || s.meter) return s;
    const e = entries.find((m) => m.quantity === s.quantity);
    return e ? { ...s, meter: { percentOfReading: e.percentOfReading, counts: e.counts, resolution: e.resolution } } : s;
  });
  return { ...doc, steps };
}

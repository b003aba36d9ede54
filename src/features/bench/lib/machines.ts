import type { VehicleDto as Vehicle } from '@shared/schema/vehicle';

/** Frame numbers and VINs are compared without spaces, dashes and case: "1m8 gdm9" finds 1M8GDM9AXKP042788. */
const compact = (s: string) => s.replace(/[\s-]+/g, '').toUpperCase();

/**
 * The machines whose label, model or frame number (VIN) hold every word typed, best first: a label
 * that starts with what was typed, then the most recently diagnosed, then by label.
 * Example: matchMachines(fleet, 'wren 02') finds W-02 "Wren 50 two-stroke scooter" only if "02" is in its label or frame number.
 */
export function matchMachines(vehicles: readonly Vehicle[], query: string): Vehicle[] {
  const words = query.trim().toLowerCase().split(/\s+/).filter(Boolean);
  const hit = (v: Vehicle) => words.every((w) =>
    v.label.toLowerCase().includes(w) || v.model.toLowerCase().includes(w) || compact(v.frameNumber).includes(compact(w)));
  const first = words.join(' ');
  const rank = (v: Vehicle) => (first && v.label.toLowerCase().startsWith(first) ? 0 : 1);
  return vehicles.filter(hit).sort((a, b) =>
    rank(a) - rank(b)
    || (b.lastDiagnosedAt ?? '').localeCompare(a.lastDiagnosedAt ?? '')
    || a.label.localeCompare(b.label, undefined, { numeric: true }));
}

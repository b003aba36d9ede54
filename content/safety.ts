import type { SafetyNote } from '@shared/schema';

/** The usual safety notes of ignition work (signal words per ANSI Z535.4 / ISO 3864-2). */

export const HT_DANGER: SafetyNote = {
  signal: 'DANGER',
  text: 'While the engine turns, the charge circuit runs at a few hundred volts and the HT lead at tens of kilovolts. Connect leads with the engine stopped, keep hands off the HT lead, plug cap and CDI terminals while cranking.',
};

export const METER_WARNING: SafetyNote = {
  signal: 'WARNING',
  text: 'Use a meter and probes rated for the circuit (IEC 61010-1 / IEC 61010-031) with a peak-voltage adapter. Never connect a meter to the HT lead or the plug cap.',
};

export const FUEL_WARNING: SafetyNote = {
  signal: 'WARNING',
  text: 'Fuel vapour ignites from a spark. Fuel tap off, no spilled fuel, good ventilation, and ground the spark tester away from the open plug hole.',
};

export const MOVING_CAUTION: SafetyNote = {
  signal: 'CAUTION',
  text: 'The flywheel and drive parts turn when cranking. Keep hands, meter leads and loose clothing clear; rear wheel off the ground or drive disengaged.',
};

export const HOT_CAUTION: SafetyNote = {
  signal: 'CAUTION',
  text: 'The engine and exhaust may be hot. Let them cool before touching, and wear gloves.',
};

export const SERVICE_DATA_NOTICE: SafetyNote = {
  signal: 'NOTICE',
  text: "The limits in this procedure are illustrative. The manufacturer's service data and local regulations come first.",
};

/** Notes for any step that cranks the engine with the ignition live. */
export const CRANKING = { safety: [HT_DANGER, FUEL_WARNING, MOVING_CAUTION], hazards: ['high-voltage', 'fuel-vapour', 'moving-parts'] as ('high-voltage' | 'fuel-vapour' | 'moving-parts')[] };
/** Notes for cranking peak-voltage readings. */
export const PEAK_READING = { safety: [HT_DANGER, METER_WARNING, MOVING_CAUTION], hazards: ['high-voltage', 'moving-parts'] as ('high-voltage' | 'moving-parts')[] };

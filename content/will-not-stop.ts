import { ask, finding, FLEET, handoff, METERS, procedure, readingMax, task } from './build';
import { CRANKING, MOVING_CAUTION, SERVICE_DATA_NOTICE } from './safety';

/**
 * "Engine will not stop": stopping a magneto ignition grounds the CDI stop input, so an open
 * anywhere in the stop circuit (switch, wire, ground, connector) keeps the engine running.
 */
export const willNotStop = procedure(
  { title: 'Engine will not stop', symptom: 'Kill switch or key does not stop the engine', ignitionSystem: 'magneto-cdi', appliesTo: FLEET, minutesPerStep: 3 },
  'stopSafely',
  [
    task('stopSafely', 'whichControl', {
      title: 'Stop the engine safely', minutes: 3, safety: [MOVING_CAUTION, SERVICE_DATA_NOTICE], hazards: ['moving-parts'],
      instructions: 'If it is running, close the fuel tap and let it run dry, or close the choke fully to stall it. Do not pull the plug cap off a running engine. Tag the machine: it will not stop.',
    }),
    ask('whichControl', 'Which control fails to stop the engine?', [
      ['kill', 'The kill switch', 'killSwitchStop'], ['key', 'The key switch', 'keySwitchOff'], ['both', 'Both', 'stopWire'],
    ], { title: 'Which stop control fails', instructions: 'Ask the rider or check the rental report.' }),
    ask('killSwitchStop', 'Kill switch in STOP: is there continuity between its stop wire and its ground wire?', [
      ['open', 'Open (OL)', 'killSwitchOpen'], ['continuity', 'Continuity (near 0 Ω)', 'stopWire'],
    ], { title: 'Kill switch in STOP', instructions: 'Unplug the kill switch connector; meter on continuity across the switch side.' }),
    finding('killSwitchOpen', 'Kill switch does not close', 'The kill switch contacts do not close in STOP, so the stop input is never grounded.', 'Replace the kill switch; confirm the engine stops with it.', [{ name: 'Kill switch (illustrative)', partNumber: 'LL-KSW-03' }]),
    ask('keySwitchOff', 'Key OFF: is there continuity across the key switch stop terminals?', [
      ['open', 'Open (OL)', 'keySwitchOpen'], ['continuity', 'Continuity (near 0 Ω)', 'stopWire'],
    ], { title: 'Key switch in OFF', instructions: 'Unplug the key switch connector; meter across the two stop terminals on the switch side.' }),
    finding('keySwitchOpen', 'Key switch does not close in OFF', 'The key switch does not ground the stop circuit in OFF.', 'Replace the key switch; confirm the engine stops with the key.', [{ name: 'Key switch (illustrative)', partNumber: 'LL-KEY-04' }]),
    readingMax('stopWire', {
      title: 'Stop wire continuity', quantity: 'resistance', unit: 'Ω', max: 1.0, meter: METERS.lowOhms, leadNull: true,
      instructions: 'Enter the lead reading, then measure the stop wire from the switch connector to the CDI stop terminal.', ok: 'switchGround', high: 'stopWireBroken',
    }),
    finding('stopWireBroken', 'Stop wire broken', 'The stop wire is broken or its terminal has pulled out.', 'Repair the wire with a soldered, sleeved joint or replace the harness section; secure it against flexing.'),
    readingMax('switchGround', {
      title: 'Switch ground to chassis', quantity: 'resistance', unit: 'Ω', max: 1.0, meter: METERS.lowOhms, leadNull: true,
      instructions: "Measure from the switches' ground wire to a clean spot on the frame.", ok: 'jumperTest', high: 'switchGroundPoor',
    }),
    finding('switchGroundPoor', 'Switch ground open', 'The switches have no good ground, so closing them grounds nothing.', 'Clean and tighten the ground eyelet and its frame point; repair the ground wire.'),
    task('jumperTest', 'stopsWithJumper', {
      title: 'Ground the CDI stop input directly', ...CRANKING,
      instructions: 'Engine stopped: fit an insulated jumper lead from the CDI stop terminal to engine ground, then try to start the engine.',
    }),
    ask('stopsWithJumper', 'With the jumper fitted, does the engine start?', [
      ['noStart', 'No: it will not start (the stop input works)', 'stopConnector'], ['starts', 'Yes: it still starts', 'cdiSubstitute'],
    ], { title: 'Result of the jumper test', instructions: 'Crank for three seconds only.', ...CRANKING }),
    finding('stopConnector', 'Stop lead connector open', 'Switches, wire and ground test good and the stop input works, so the connector at the CDI does not make contact.', 'Clean or replace the stop terminal at the CDI connector; confirm both controls stop the engine.'),
    task('cdiSubstitute', 'stopsAfterSwap', {
      title: 'Substitute the CDI unit', minutes: 10,
      instructions: 'The CDI ignores its stop input. Fit a known-good unit of the same part number.',
    }),
    ask('stopsAfterSwap', 'With the known-good CDI, does the kill switch stop the engine?', [['yes', 'Yes', 'cdiStopFaulty'], ['no', 'No', 'unresolved']], {
      title: 'Stop test with the substitute CDI', instructions: 'Start the engine, then use the kill switch.', ...CRANKING,
    }),
    finding('cdiStopFaulty', 'CDI stop input faulty', 'The CDI does not respond to a grounded stop input.', 'Fit a new CDI unit; confirm both controls stop the engine.', [{ name: 'CDI unit (illustrative)', partNumber: 'LL-CDI-07' }]),
    handoff('unresolved', 'Will not stop, cause not found', 'The stop circuit tests good and a known-good CDI changes nothing. A senior technician takes over; keep the machine tagged.'),
  ],
);

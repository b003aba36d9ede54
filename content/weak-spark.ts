import { ask, finding, FLEET, handoff, METERS, procedure, reading3, secondaryAt20, readingMax, readingMin, task } from './build';
import { CRANKING, HOT_CAUTION, PEAK_READING, SERVICE_DATA_NOTICE } from './safety';

const COIL = [{ name: 'Ignition coil (illustrative)', partNumber: 'LL-IGC-01' }];
const STATOR = [{ name: 'Stator with exciter and pulser windings (illustrative)', partNumber: 'LL-STA-02' }];

/** "Weak or intermittent spark": plug, cap, HT lead, connectors, grounds, coil, charge energy, CDI output, last the CDI. */
export const weakSpark = procedure(
  { title: 'Weak or intermittent spark', symptom: 'Spark is weak, orange or comes and goes; misfire or hard starting', ignitionSystem: 'magneto-cdi', appliesTo: FLEET, minutesPerStep: 3 },
  'prepare',
  [
    task('prepare', 'plugInspect', {
      title: 'Prepare the machine', minutes: 5, safety: [SERVICE_DATA_NOTICE],
      instructions: 'Machine on a stand, fuel tap off. Remove the spark plug and lay it on a clean cloth.',
    }),
    ask('plugInspect', 'How does the spark plug look?', [
      ['fouled', 'Wet, oily or carboned', 'plugReplace'], ['cracked', 'Cracked insulator or worn electrodes', 'plugReplace'], ['ok', 'Clean, tan to grey', 'plugGap'],
    ], { title: 'Inspect the spark plug', instructions: 'Look at the insulator nose, the electrodes and the ceramic above the hex.' }),
    finding('plugReplace', 'Spark plug worn or fouled', 'A fouled or cracked plug leaks the spark energy away.', 'Fit a new plug of the listed heat range, gapped to the service data; look for the cause of fouling (mixture, oil ratio).', [{ name: 'Spark plug (illustrative)', partNumber: 'LL-SPK-08' }]),
    reading3('plugGap', {
      title: 'Spark plug gap', quantity: 'length', unit: 'mm', min: 0.0006, max: 0.0008,
      instructions: 'Measure the gap with a wire feeler gauge.', low: 'plugRegap', ok: 'capOhms', high: 'plugRegap',
    }),
    finding('plugRegap', 'Spark plug gap out of limits', 'The plug gap is outside the limits.', 'Set the gap to mid-limits with a gapping tool; replace the plug if the electrodes are rounded.'),
    reading3('capOhms', {
      title: 'Plug cap resistance', quantity: 'resistance', unit: 'kΩ', min: 4000, max: 6000, meter: METERS.kiloOhms, decision: 'guarded',
      borderline: { action: 'branch', next: 'capReplace', label: 'Borderline: replace' },
      instructions: 'Unscrew the cap from the HT lead; measure end to end. A borderline cap is replaced: it is cheap and drifts when hot.',
      low: 'capReplace', ok: 'htLead', high: 'capReplace',
    }),
    finding('capReplace', 'Plug cap out of limits', 'The resistor plug cap is out of limits or borderline.', 'Replace the plug cap; re-cut 5 mm of HT lead for a fresh contact.', [{ name: 'Resistor plug cap (illustrative)', partNumber: 'LL-CAP-05' }]),
    ask('htLead', 'Is the HT lead cracked, chafed, or does it show arcing marks?', [['damaged', 'Damaged or arcing', 'htLeadFaulty'], ['ok', 'Sound', 'connectors']], {
      title: 'Inspect the HT lead', instructions: 'Bend the lead gently along its length; look for tracking marks to the frame.',
    }),
    finding('htLeadFaulty', 'HT lead damaged', 'The HT lead leaks spark energy to the frame.', 'Replace the coil or the lead where it is replaceable; route it away from sharp edges.', COIL),
    ask('connectors', 'Are the connectors at the CDI, coil and stator clean and tight?', [['bad', 'Corroded, loose or burnt', 'connectorFault'], ['ok', 'Clean and tight', 'groundCoil']], {
      title: 'Inspect the ignition connectors', instructions: 'Unplug each connector, look at the pins, check each one grips.',
    }),
    finding('connectorFault', 'Ignition connector fault', 'A corroded or loose connector drops the ignition signal.', 'Clean or replace the terminals, apply dielectric grease, secure the connector.'),
    readingMax('groundCoil', {
      title: 'Coil and CDI ground', quantity: 'resistance', unit: 'Ω', max: 0.5, meter: METERS.lowOhms, leadNull: true,
      instructions: 'Enter the lead reading, then measure from the coil mounting and the CDI ground wire to the engine case.', ok: 'engineTemp', high: 'groundPoor',
    }),
    finding('groundPoor', 'Poor ignition ground', 'The coil or CDI ground has too much resistance to the engine.', 'Clean ground terminals and mounting faces to bare metal, tighten, protect with dielectric grease.'),
    readingMax('engineTemp', {
      title: 'Engine temperature', quantity: 'temperature', unit: '°C', max: 40, safety: [HOT_CAUTION], hazards: ['hot-surface'],
      instructions: 'Measure the cylinder fins with a contact thermometer.', ok: 'coilPrimary', high: 'letCool',
    }),
    task('letCool', 'engineTemp', { title: 'Let the engine cool', instructions: 'Wait about 20 minutes, then measure again.', minutes: 20 }),
    reading3('coilPrimary', {
      title: 'Coil primary resistance', quantity: 'resistance', unit: 'Ω', min: 0.1, max: 1.0, meter: METERS.lowOhms, decision: 'guarded',
      leadNull: true, winding: { material: 'copper', temperatureStep: 'engineTemp' },
      instructions: 'Disconnect the CDI lead from the primary terminal, null the leads, measure primary terminal to coil ground.',
      low: 'coilFaulty', ok: 'coilSecondary', high: 'coilFaulty',
    }),
    finding('coilFaulty', 'Ignition coil out of limits', 'A coil winding is shorted, open or out of limits.', 'Replace the ignition coil.', COIL),
    reading3('coilSecondary', {
      title: 'Coil secondary resistance', quantity: 'resistance', unit: 'kΩ', min: 2200, max: 4900, meter: METERS.kiloOhms,
      instructions: 'Cap removed: HT lead core to primary terminal. The next step corrects it to 20 °C.', low: 'coilFaulty', ok: 'secondaryAt20', high: 'coilFaulty',
    }),
    secondaryAt20({ low: 'coilFaulty', ok: 'exciterPeak', high: 'coilFaulty' }),
    {
      id: 'exciterPeak', kind: 'reading', title: 'Exciter cranking peak voltage', quantity: 'peak-voltage', unit: 'V',
      limits: { kind: 'range', min: 100 }, meter: METERS.peakVolts,
      instructions: 'Back-probe the exciter wire at the CDI with the peak-voltage adapter and crank. The next step works out the energy it stores.',
      // One band: the stored energy computed next decides the route.
      bands: [{ id: 'any', label: 'Any value', next: 'storedEnergy' }], ...PEAK_READING,
    },
    {
      // The storage capacitor of these units is about 1 µF (illustrative); it charges to the exciter peak.
      id: 'storedEnergy', kind: 'formula', title: 'Energy stored per spark', expression: '0.5 * "1 µF" * exciterPeak ** 2', quantity: 'energy', unit: 'mJ',
      instructions: 'E = ½CV² with the 1 µF storage capacitor charged to the exciter peak.', limits: { kind: 'range', min: 0.005 },
      bands: [
        { id: 'low', label: 'Below 5 mJ', upper: { value: 0.005, inclusive: false }, next: 'exciterOhms' },
        { id: 'ok', label: '5 mJ or more', lower: { value: 0.005, inclusive: true }, next: 'clampDiode' },
      ],
    },
    reading3('exciterOhms', {
      title: 'Exciter winding resistance', quantity: 'resistance', unit: 'Ω', min: 150, max: 600, meter: METERS.ohms,
      instructions: 'Unplug the stator connector; measure across the exciter wires on the stator side.', low: 'statorFaulty', ok: 'magnets', high: 'statorFaulty',
    }),
    finding('statorFaulty', 'Exciter winding faulty', 'The exciter winding is shorted or open, so the capacitor charges too little.', 'Replace the stator; check the flywheel magnets while it is off.', STATOR),
    handoff('magnets', 'Low charge with a sound winding', 'The exciter winding measures within limits but charges too little: flywheel magnets or cranking speed. A senior technician checks them.'),
    ask('clampDiode', 'Does the wiring diagram show a clamp diode across the coil primary?', [
      ['diode', 'Yes, a clamp diode', 'cdiPeakDiode'], ['plain', 'No diode', 'cdiPeakPlain'],
    ], { title: 'CDI with or without a clamp diode', instructions: 'The diode clips the negative swing, so the output reads differently with a peak adapter.' }),
    readingMin('cdiPeakDiode', {
      title: 'CDI output peak (clamped primary)', quantity: 'peak-voltage', unit: 'V', min: 100, meter: METERS.peakVolts,
      instructions: 'Peak adapter on the coil primary terminal to ground, positive polarity; crank.', low: 'cdiSubstitute', ok: 'wiggle', ...PEAK_READING,
    }),
    readingMin('cdiPeakPlain', {
      title: 'CDI output peak (unclamped primary)', quantity: 'peak-voltage', unit: 'V', min: 150, meter: METERS.peakVolts,
      instructions: 'Peak adapter on the coil primary terminal to ground; crank.', low: 'cdiSubstitute', ok: 'wiggle', ...PEAK_READING,
    }),
    ask('wiggle', 'With a spark tester fitted, does the spark cut out while you flex the harness?', [
      ['cuts', 'Yes, it cuts out', 'harnessIntermittent'], ['steady', 'No, steady', 'pulserGap'],
    ], { title: 'Harness wiggle test', instructions: 'Crank or idle and flex the harness section by section.', ...CRANKING }),
    finding('harnessIntermittent', 'Intermittent wire or connector', 'A wire or terminal breaks contact when the harness moves.', 'Repair the wire or terminal where the spark cut out; secure the harness.'),
    reading3('pulserGap', {
      title: 'Pulser air gap', quantity: 'length', unit: 'mm', min: 0.0003, max: 0.001,
      instructions: 'Non-magnetic feeler gauge between the pulser and a trigger lobe.', low: 'pulserGapWrong', ok: 'cdiSubstitute', high: 'pulserGapWrong',
    }),
    finding('pulserGapWrong', 'Pulser air gap out of limits', 'A wide gap gives a weak, late trigger.', 'Reset the air gap to mid-limits and secure the pulser.'),
    task('cdiSubstitute', 'sparkAfterSwap', {
      title: 'Substitute the CDI unit', minutes: 10,
      instructions: 'A potted CDI cannot be tested inside. Fit a known-good unit of the same part number.',
    }),
    ask('sparkAfterSwap', 'Is the spark strong and steady with the known-good CDI?', [['yes', 'Yes', 'cdiFaulty'], ['no', 'No change', 'unresolved']], {
      title: 'Spark test with the substitute CDI', instructions: 'Spark tester on the cap, crank.', ...CRANKING,
    }),
    finding('cdiFaulty', 'CDI unit faulty', 'All inputs test good and a known-good CDI restores a strong spark.', 'Fit a new CDI unit; confirm start, idle and stop.', [{ name: 'CDI unit (illustrative)', partNumber: 'LL-CDI-07' }]),
    handoff('unresolved', 'Weak spark, cause not found', 'All checks pass and a known-good CDI changes nothing. A senior technician takes over with this record.'),
  ],
);

import { ask, finding, FLEET, handoff, METERS, procedure, reading3, secondaryAt20, readingMax, readingMin, task } from './build';
import { CRANKING, HOT_CAUTION, PEAK_READING, SERVICE_DATA_NOTICE } from './safety';

const COIL = [{ name: 'Ignition coil (illustrative)', partNumber: 'LL-IGC-01' }];
const STATOR = [{ name: 'Stator with exciter and pulser windings (illustrative)', partNumber: 'LL-STA-02' }];

/** "No spark": from the spark test through the stop circuit, cap, ground and windings to the CDI, last. */
export const noSpark = procedure(
  { title: 'No spark', symptom: 'No spark at the plug; engine cranks but will not start', ignitionSystem: 'magneto-cdi', appliesTo: FLEET, minutesPerStep: 3 },
  'prepare',
  [
    task('prepare', 'sparkTest', {
      title: 'Prepare the machine',
      instructions: 'Machine on a stand, fuel tap off, plug removed and refitted to its cap. Fit a spark tester to the plug cap and ground it to the engine.',
      safety: [SERVICE_DATA_NOTICE], minutes: 5,
    }),
    ask('sparkTest', 'Crank the engine. What does the spark tester show?', [
      ['strong', 'Strong blue spark', 'sparkGood'], ['weak', 'Weak or orange spark', 'useWeakSpark'], ['none', 'No spark', 'isolateStop'],
    ], { title: 'Spark test', instructions: 'Crank briskly for three seconds with the kill switch in RUN and the key ON.', ...CRANKING }),
    handoff('sparkGood', 'Spark is present', 'The ignition makes a strong spark; the no-start lies in fuel, air or compression. A senior technician takes it from here.'),
    {
      id: 'useWeakSpark', kind: 'link', procedure: 'weak-spark', title: 'Continue in "Weak or intermittent spark"',
      instructions: 'There is a spark but it is weak: the diagnosis goes on in the weak-spark procedure, in the same record.',
    },
    task('isolateStop', 'sparkRetest', {
      title: 'Isolate the stop circuit',
      instructions: 'Unplug the stop lead (kill switch and key switch) at the CDI so that nothing can ground the stop input.',
    }),
    ask('sparkRetest', 'Crank again. Is there a spark now?', [['yes', 'Yes, a spark', 'killSwitchRun'], ['no', 'Still no spark', 'capOhms']], {
      title: 'Spark test with the stop circuit isolated', instructions: 'Stop lead still unplugged.', ...CRANKING,
    }),
    ask('killSwitchRun', 'Kill switch in RUN: does the meter show continuity between its stop wire and its ground wire?', [
      ['continuity', 'Continuity (near 0 Ω)', 'killSwitchShorted'], ['open', 'Open (OL)', 'keySwitchOn'],
    ], { title: 'Kill switch in RUN', instructions: 'Unplug the kill switch connector; meter on the continuity range across the switch side.' }),
    finding('killSwitchShorted', 'Kill switch shorted in RUN', 'The kill switch grounds the CDI stop input even in RUN.', 'Replace the kill switch; reconnect the stop lead and repeat the spark test.', [{ name: 'Kill switch (illustrative)', partNumber: 'LL-KSW-03' }]),
    ask('keySwitchOn', 'Key ON: does the meter show continuity across the key switch stop terminals?', [
      ['continuity', 'Continuity (near 0 Ω)', 'keySwitchShorted'], ['open', 'Open (OL)', 'harnessChafe'],
    ], { title: 'Key switch ON', instructions: 'Unplug the key switch connector; meter across the two stop terminals on the switch side.' }),
    finding('keySwitchShorted', 'Key switch shorted in ON', 'The key switch grounds the stop circuit with the key ON.', 'Replace the key switch; repeat the spark test.', [{ name: 'Key switch (illustrative)', partNumber: 'LL-KEY-04' }]),
    ask('harnessChafe', 'Both switches unplugged: is there continuity from the stop wire in the harness to the chassis?', [
      ['continuity', 'Continuity to chassis', 'harnessChafed'], ['open', 'Open (OL)', 'stopIntermittent'],
    ], { title: 'Stop wire to chassis', instructions: 'Meter from the stop wire at the CDI connector to a clean spot on the frame. Flex the harness along the frame while watching.' }),
    finding('harnessChafed', 'Stop wire chafed to chassis', 'The stop wire is worn through its insulation and grounds on the frame.', 'Find the chafe (look where the harness crosses the frame and steering stops), repair and sleeve the wire, re-route it clear.'),
    handoff('stopIntermittent', 'Stop circuit grounds intermittently', 'Isolating the stop circuit brought the spark back but switches and harness test open; a senior technician traces the intermittent ground.'),
    reading3('capOhms', {
      title: 'Plug cap resistance', quantity: 'resistance', unit: 'kΩ', min: 4000, max: 6000, meter: METERS.kiloOhms,
      instructions: 'Unscrew the cap from the HT lead; measure end to end.', low: 'capFaulty', ok: 'groundCheck', high: 'capFaulty',
    }),
    finding('capFaulty', 'Plug cap out of limits', 'The resistor plug cap is open or out of limits.', 'Replace the plug cap; re-cut 5 mm of HT lead for a fresh contact.', [{ name: 'Resistor plug cap (illustrative)', partNumber: 'LL-CAP-05' }]),
    readingMax('groundCheck', {
      title: 'CDI and coil ground', quantity: 'resistance', unit: 'Ω', max: 0.5, meter: METERS.lowOhms, leadNull: true,
      instructions: 'Touch the leads together and enter the lead reading, then measure from the CDI ground wire and the coil mounting to the engine case.',
      ok: 'engineTemp', high: 'groundPoor',
    }),
    finding('groundPoor', 'Poor ignition ground', 'The CDI or coil ground has too much resistance to the engine.', 'Clean the ground terminals and mounting faces to bare metal, tighten, protect with dielectric grease.'),
    readingMax('engineTemp', {
      title: 'Engine temperature', quantity: 'temperature', unit: '°C', max: 40,
      instructions: 'Measure the cylinder fins with a contact thermometer. Winding limits are given at 20 °C; the app corrects to it.',
      ok: 'coilPrimary', high: 'letCool', safety: [HOT_CAUTION], hazards: ['hot-surface'],
    }),
    task('letCool', 'engineTemp', { title: 'Let the engine cool', instructions: 'Wait about 20 minutes, then measure the temperature again.', minutes: 20 }),
    reading3('coilPrimary', {
      title: 'Coil primary resistance', quantity: 'resistance', unit: 'Ω', min: 0.1, max: 1.0,
      meter: METERS.lowOhms, decision: 'guarded', leadNull: true, winding: { material: 'copper', temperatureStep: 'engineTemp' },
      instructions: 'Disconnect the CDI lead from the coil primary terminal, null the test leads, then measure from the primary terminal to the coil ground.',
      low: 'coilFaulty', ok: 'coilSecondary', high: 'coilFaulty',
    }),
    finding('coilFaulty', 'Ignition coil out of limits', 'A coil winding is open, shorted or out of limits.', 'Replace the ignition coil; check the cap and HT lead while it is off.', COIL),
    reading3('coilSecondary', {
      title: 'Coil secondary resistance', quantity: 'resistance', unit: 'kΩ', min: 2200, max: 4900, meter: METERS.kiloOhms,
      // Wide enough for any allowed engine temperature; the Formula after it decides at 20 °C.
      instructions: 'Cap removed: measure from the HT lead core to the primary terminal. The next step corrects it to 20 °C.',
      low: 'coilFaulty', ok: 'secondaryAt20', high: 'coilFaulty',
    }),
    secondaryAt20({ low: 'coilFaulty', ok: 'exciterOhms', high: 'coilFaulty' }),
    reading3('exciterOhms', {
      title: 'Exciter (charge) winding resistance', quantity: 'resistance', unit: 'Ω', min: 150, max: 600, meter: METERS.ohms,
      instructions: 'Unplug the stator connector; measure across the exciter winding wires on the stator side.',
      low: 'statorFaulty', ok: 'exciterPeak', high: 'statorFaulty',
    }),
    finding('statorFaulty', 'Stator winding faulty', 'The exciter or pulser winding is open, shorted or gives too little output.', 'Replace the stator (or the single winding where sold separately); check the flywheel magnets while it is off.', STATOR),
    readingMin('exciterPeak', {
      title: 'Exciter cranking peak voltage', quantity: 'peak-voltage', unit: 'V', min: 100, meter: METERS.peakVolts,
      instructions: 'Stator reconnected; back-probe the exciter wire at the CDI with the peak-voltage adapter and crank.',
      low: 'statorFaulty', ok: 'pulserOhms', ...PEAK_READING,
    }),
    reading3('pulserOhms', {
      title: 'Pulser winding resistance', quantity: 'resistance', unit: 'Ω', min: 100, max: 300, meter: METERS.ohms,
      instructions: 'Unplug the pulser connector; measure across the pulser wires on the pulser side.', low: 'statorFaulty', ok: 'pulserGap', high: 'statorFaulty',
    }),
    reading3('pulserGap', {
      title: 'Pulser air gap', quantity: 'length', unit: 'mm', min: 0.0003, max: 0.001,
      instructions: 'Turn the flywheel until a trigger lobe faces the pulser; measure the gap with a non-magnetic feeler gauge.',
      low: 'pulserGapWrong', ok: 'pulserPeak', high: 'pulserGapWrong',
    }),
    finding('pulserGapWrong', 'Pulser air gap out of limits', 'The pulser sits too close to or too far from the trigger lobe.', 'Reset the air gap to mid-limits, tighten the pulser screws with thread locker, re-test.'),
    readingMin('pulserPeak', {
      title: 'Pulser cranking peak voltage', quantity: 'peak-voltage', unit: 'V', min: 1.0, meter: METERS.peakVolts,
      instructions: 'Back-probe the pulser wire at the CDI with the peak-voltage adapter and crank.', low: 'flywheelKey', ok: 'cdiSubstitute', ...PEAK_READING,
    }),
    ask('flywheelKey', 'Flywheel off: is the key intact and the flywheel seated on it?', [
      ['sheared', 'Key sheared or flywheel turned', 'keySheared'], ['intact', 'Key intact', 'statorFaulty'],
    ], { title: 'Flywheel key', instructions: 'Remove the flywheel with the correct puller; inspect the key, keyway and magnets.' }),
    finding('keySheared', 'Flywheel key sheared', 'The flywheel has turned on the crank, so the pulser triggers at the wrong time.', 'Fit a new key, clean the taper, torque the flywheel nut to the service data.', [{ name: 'Flywheel key (illustrative)', partNumber: 'LL-KEY-06' }]),
    task('cdiSubstitute', 'sparkAfterSwap', {
      title: 'Substitute the CDI unit', minutes: 10,
      instructions: 'A potted CDI cannot be tested inside and static ohm tests of it are unreliable. Fit a known-good unit of the same part number, stop lead still unplugged.',
    }),
    ask('sparkAfterSwap', 'Crank: is there a spark with the known-good CDI?', [['yes', 'Yes, strong spark', 'cdiFaulty'], ['no', 'Still no spark', 'unresolved']], {
      title: 'Spark test with the substitute CDI', instructions: 'Spark tester as before.', ...CRANKING,
    }),
    finding('cdiFaulty', 'CDI unit faulty', 'Every input to the CDI tests good and a known-good unit restores the spark.', 'Fit a new CDI unit; reconnect the stop lead and confirm the engine starts and stops.', [{ name: 'CDI unit (illustrative)', partNumber: 'LL-CDI-07' }]),
    handoff('unresolved', 'No spark, cause not found', 'All checks pass and a known-good CDI does not restore the spark. A senior technician takes over with the record of this diagnosis.'),
  ],
);

// 555 timer as an astable: C charges through RA + RB (or RA alone past a diode) and discharges through RB.
import { rcSegmentTime } from '../rc';
import type { CircuitModel, ModelInput, ModelIssue } from './model';
import { capacitor, checkPositive, eng, finiteOnly, oscillatorHeadline, oscillatorResults, resistor, voltage, voltageCautions } from './common';
import { relaxationResults, relaxationWaveform, type Relaxation } from './relaxation';
import { controlIssues, controlParam, levelLabels, supplyCautions, supplyIssues } from './555-common';

const datasheet = 'Texas Instruments NE555 datasheet (SLFS022), equations for astable operation; thresholds generalised to any control voltage by the RC charging law';

function chargeResistance(input: ModelInput): number {
  return input.choices.diode === 'yes' ? input.values.ra : input.values.ra + input.values.rb;
}

function relaxation(input: ModelInput): Relaxation {
  const { supply, rb, c, control } = input.values;
  const tauCharge = chargeResistance(input) * c;
  const tauDischarge = rb * c;
  const trigger = control / 2;
  return {
    startup: { v0: 0, vInf: supply, tau: tauCharge, duration: rcSegmentTime(0, control, supply, tauCharge), output: supply },
    first: { v0: control, vInf: 0, tau: tauDischarge, duration: rcSegmentTime(control, trigger, 0, tauDischarge), output: 0 },
    second: { v0: trigger, vInf: supply, tau: tauCharge, duration: rcSegmentTime(trigger, control, supply, tauCharge), output: supply },
    highIs: 'second',
  };
}

export const ne555Astable: CircuitModel = {
  id: '555-astable',
  title: '555 astable oscillator',
  summary: 'A 555 timer free-running: C charges through RA + RB to the control voltage and discharges through RB to half of it.',
  assumptions: [
    'Ideal 555: threshold at the control voltage, trigger at half of it, no pin currents, output at supply when high and 0 V when low.',
    'The discharge transistor is a short to 0 V while on; with `diode: yes` an ideal diode (no forward drop) bypasses RB while charging.',
    'first-edge: the capacitor starts at 0 V with the output high; it is the time until the capacitor first reaches the control voltage (the first output edge). It is longer than a steady high time because the charge starts from 0 V, not from control/2.',
  ],
  params: [
    voltage('supply', 'supply voltage VCC', 'Supply of the 555.'),
    resistor('ra', 'resistor RA', 'Resistor from VCC to the discharge pin.'),
    resistor('rb', 'resistor RB', 'Resistor from the discharge pin to the threshold/trigger node.'),
    capacitor('c', 'timing capacitor C', 'Capacitor from threshold/trigger to 0 V.'),
    controlParam,
    { kind: 'choice', key: 'diode', label: 'diode across RB', options: ['no', 'yes'], default: 'no', description: 'yes: a diode bypasses RB while C charges, so the high time depends on RA alone.' },
  ],
  results: oscillatorResults,
  headline: oscillatorHeadline,

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['supply', 'ra', 'rb', 'c', 'control'], issues)) return issues;
    issues.push(...controlIssues(input), ...supplyIssues(input));
    return issues;
  },

  compute: (input) => finiteOnly(relaxationResults(relaxation(input))),

  working(input, results) {
    const { supply, ra, rb, c, control } = input.values;
    const viaDiode = input.choices.diode === 'yes';
    const charge = viaDiode ? 'RA' : '(RA + RB)';
    const chargeNumbers = viaDiode ? eng(ra, 'Ω') : `(${eng(ra, 'Ω')} + ${eng(rb, 'Ω')})`;
    return [
      {
        formula: `t_high = ${charge}·C·ln((VCC − Vctl/2)/(VCC − Vctl)) (= 0.693·${charge}·C at Vctl = 2/3 VCC)`,
        substituted: `t_high = ${chargeNumbers} · ${eng(c, 'F')} · ln((${eng(supply, 'V')} − ${eng(control / 2, 'V')})/(${eng(supply, 'V')} − ${eng(control, 'V')})) = ${eng(results.high, 's')}`,
        source: datasheet,
      },
      {
        formula: 't_low = RB·C·ln 2',
        substituted: `t_low = ${eng(rb, 'Ω')} · ${eng(c, 'F')} · 0.6931 = ${eng(results.low, 's')}`,
        source: datasheet,
      },
      {
        formula: `first edge = ${charge}·C·ln(VCC/(VCC − Vctl))`,
        substituted: `first edge = ${chargeNumbers} · ${eng(c, 'F')} · ln(${eng(supply, 'V')}/(${eng(supply, 'V')} − ${eng(control, 'V')})) = ${eng(results['first-edge'], 's')}`,
        source: 'standard RC charging law from 0 V, common practice',
      },
      { formula: 'f = 1/(t_high + t_low)', substituted: `f = 1/${eng(results.period, 's')} = ${eng(results.frequency, 'Hz')}`, source: datasheet },
    ];
  },

  waveform: (input, cycles) => relaxationWaveform(relaxation(input), cycles, levelLabels(input)),

  cautions: (input) => [...supplyCautions(input), ...voltageCautions(input, ['supply', 'control'])],
};

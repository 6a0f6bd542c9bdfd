/**
 * The project file: `{"format": "torquewise-project", "version": 1, ...}`.
 *
 * KEYS below is the documentation of every key (unit and meaning) and the source of the unit in
 * every message. Paths use `[]` for array elements. Messages are our own phrasing, e.g.
 * `motor.Ld must be > 0 H`.
 */
import { z } from 'zod';
import { InputError } from '../base/errors';
import type { Nameplate } from '../machine/nameplate';

export const PROJECT_FORMAT = 'torquewise-project';
export const PROJECT_VERSION = 1;

/**
 * Largest project file read, in bytes, by the desktop app and the web page alike (a project is a
 * few kB); the web page checks a picked file's size against it before reading it.
 */
export const MAX_PROJECT_BYTES = 16 * 1024 * 1024;

/**
 * Most entries in any one list of a project: requirements, scenario.speedSteps, torqueSteps,
 * loadSteps and loadRamps (a project has a handful of each). A longer list is refused by its
 * length, before any entry is looked at, so a file with a million entries is answered at once.
 */
export const MAX_LIST_ENTRIES = 1000;

/** The lists MAX_LIST_ENTRIES applies to, as paths from the project root. */
export const CAPPED_LISTS: readonly (readonly string[])[] = [
  ['requirements'],
  ['scenario', 'speedSteps'],
  ['scenario', 'torqueSteps'],
  ['scenario', 'loadSteps'],
  ['scenario', 'loadRamps'],
];

/** unit ('' = dimensionless or text) and meaning of every key of the project file */
export const KEYS: Readonly<Record<string, { unit: string; doc: string }>> = {
  format: { unit: '', doc: `always "${PROJECT_FORMAT}"` },
  version: { unit: '', doc: `file format version, ${PROJECT_VERSION}` },
  name: { unit: '', doc: 'project name' },
  note: { unit: '', doc: 'free text' },

  motor: { unit: '', doc: 'dq model at 20 °C (give this or nameplate)' },
  'motor.polePairs': { unit: '', doc: 'pole pairs p (not poles)' },
  'motor.Rs': { unit: 'ohm', doc: 'stator resistance per phase (star equivalent) at 20 °C' },
  'motor.Ld': { unit: 'H', doc: 'd-axis inductance per phase' },
  'motor.Lq': { unit: 'H', doc: 'q-axis inductance per phase' },
  'motor.psiM': { unit: 'Wb', doc: 'peak magnet flux linkage per phase at 20 °C' },
  'motor.inertia': { unit: 'kg·m²', doc: 'rotor inertia' },
  'motor.viscousFriction': { unit: 'N·m·s/rad', doc: 'viscous friction B, default 0' },
  'motor.coulombFriction': { unit: 'N·m', doc: 'Coulomb friction, default 0' },
  'motor.maxSpeed_rpm': { unit: 'rpm', doc: 'maximum mechanical speed (safety checks and plot range)' },
  'motor.ratedCurrent': { unit: 'A', doc: "the motor's rated (continuous) phase current, A peak; the continuous limit is the lower of this and inverter.Icont" },
  'motor.peakCurrent': { unit: 'A', doc: "the motor's peak phase current (demagnetisation and heat), A peak; the peak limit is the lower of this and inverter.Imax" },

  nameplate: { unit: '', doc: 'motor in datasheet terms (give this or motor)' },
  'nameplate.poles': { unit: '', doc: 'number of magnet poles (even); or polePairs' },
  'nameplate.polePairs': { unit: '', doc: 'pole pairs; or poles' },
  'nameplate.R': { unit: '', doc: 'winding resistance {value, basis, temp_C}' },
  'nameplate.R.value': { unit: 'ohm', doc: 'resistance' },
  'nameplate.R.basis': { unit: '', doc: '"phase" or "line-to-line" (star equivalent = half)' },
  'nameplate.R.temp_C': { unit: '°C', doc: 'temperature of the measurement, default 20' },
  'nameplate.L': { unit: '', doc: 'synchronous inductance of a surface-magnet motor {value, basis}' },
  'nameplate.L.value': { unit: 'H', doc: 'inductance' },
  'nameplate.L.basis': { unit: '', doc: '"phase" or "line-to-line"' },
  'nameplate.Ld': { unit: '', doc: 'd-axis inductance {value, basis}' },
  'nameplate.Ld.value': { unit: 'H', doc: 'inductance' },
  'nameplate.Ld.basis': { unit: '', doc: '"phase" or "line-to-line"' },
  'nameplate.Lq': { unit: '', doc: 'q-axis inductance {value, basis}; missing = surface magnet' },
  'nameplate.Lq.value': { unit: 'H', doc: 'inductance' },
  'nameplate.Lq.basis': { unit: '', doc: '"phase" or "line-to-line"' },
  'nameplate.Ke': { unit: '', doc: 'back-EMF constant {value, unit, temp_C}' },
  'nameplate.Ke.value': { unit: '', doc: 'in the stated unit' },
  'nameplate.Ke.unit': { unit: '', doc: '"V_LL_rms/krpm", "V_LL_peak/krpm" or "V_ph_peak*s/rad" (per electrical rad/s)' },
  'nameplate.Ke.temp_C': { unit: '°C', doc: 'magnet temperature of the measurement, default 20' },
  'nameplate.Kt': { unit: '', doc: 'torque constant {value, unit, temp_C}' },
  'nameplate.Kt.value': { unit: '', doc: 'in the stated unit' },
  'nameplate.Kt.unit': { unit: '', doc: '"Nm/A_rms" or "Nm/A_peak"' },
  'nameplate.Kt.temp_C': { unit: '°C', doc: 'magnet temperature, default that of Ke' },
  'nameplate.ratedCurrent': { unit: '', doc: 'rated phase current {value, basis}' },
  'nameplate.ratedCurrent.value': { unit: 'A', doc: 'current' },
  'nameplate.ratedCurrent.basis': { unit: '', doc: '"rms" or "peak"' },
  'nameplate.peakCurrent': { unit: '', doc: 'peak phase current {value, basis}' },
  'nameplate.peakCurrent.value': { unit: 'A', doc: 'current' },
  'nameplate.peakCurrent.basis': { unit: '', doc: '"rms" or "peak"' },
  'nameplate.ratedSpeed_rpm': { unit: 'rpm', doc: 'rated speed' },
  'nameplate.ratedTorque_Nm': { unit: 'N·m', doc: 'rated torque' },
  'nameplate.maxSpeed_rpm': { unit: 'rpm', doc: 'maximum mechanical speed' },
  'nameplate.inertia': { unit: 'kg·m²', doc: 'rotor inertia' },
  'nameplate.viscousFriction': { unit: 'N·m·s/rad', doc: 'viscous friction, default 0' },
  'nameplate.coulombFriction': { unit: 'N·m', doc: 'Coulomb friction, default 0' },

  inverter: { unit: '', doc: 'the drive' },
  'inverter.Vdc': { unit: 'V', doc: 'DC-bus voltage' },
  'inverter.Imax': { unit: 'A', doc: 'peak phase current limit (A peak)' },
  'inverter.Icont': { unit: 'A', doc: 'continuous phase current limit (A peak), <= Imax' },
  'inverter.modulation': { unit: '', doc: '"sinusoidal", "svpwm" or "six-step"; "svpwm" when not given (with a finding)' },
  'inverter.voltageUtilization': { unit: '', doc: 'fraction of the modulation limit, 0.001 to 1, default 1' },
  'inverter.deviceDrop': { unit: 'V', doc: 'on-state drop per device, default 0' },

  conditions: { unit: '', doc: 'temperatures; when absent every temperature is 20 °C (with a finding)' },
  'conditions.windingTemp_C': { unit: '°C', doc: 'winding temperature, hot corner, 20 when not given (with a finding)' },
  'conditions.magnetTemp_C': { unit: '°C', doc: 'magnet temperature, hot corner, default 20' },
  'conditions.coldTemp_C': { unit: '°C', doc: 'winding and magnet temperature, cold corner (highest back-EMF), 20 when not given (with a finding)' },
  'conditions.magnetTempCoeff': { unit: '/K', doc: 'remanence coefficient, -0.003..0.001, default -0.0012 (sintered NdFeB; SmCo about -0.0004)' },

  requirements: { unit: '', doc: `operating points to meet, at most ${MAX_LIST_ENTRIES}` },
  'requirements[]': { unit: '', doc: '{label, speed_rpm, torque_Nm, duty}' },
  'requirements[].label': { unit: '', doc: 'name of the point' },
  'requirements[].speed_rpm': { unit: 'rpm', doc: 'mechanical speed, >= 0' },
  'requirements[].torque_Nm': { unit: 'N·m', doc: 'torque; negative = braking' },
  'requirements[].duty': { unit: '', doc: '"peak" (default: checked against the peak current limit) or "continuous" (checked against the continuous limit, the lower of inverter.Icont and the motor\'s rated current)' },

  control: { unit: '', doc: 'the drive controller' },
  'control.mode': { unit: '', doc: '"speed", "torque" or "current-step", default "speed"' },
  'control.fCtrl_Hz': { unit: 'Hz', doc: 'control (current-loop) rate, default 10000' },
  'control.delaySamples': { unit: '', doc: 'periods between sampling and applying the voltage, default 1' },
  'control.currentBandwidth_Hz': { unit: 'Hz', doc: 'current-loop bandwidth (or currentKp/currentKi)' },
  'control.currentKp': { unit: 'V/A', doc: 'current PI proportional gain' },
  'control.currentKi': { unit: 'V/(A·s)', doc: 'current PI integral gain' },
  'control.speedBandwidth_Hz': { unit: 'Hz', doc: 'speed-loop bandwidth (or speedKp/speedKi or speedTuning)' },
  'control.speedKp': { unit: 'N·m·s/rad', doc: 'speed PI proportional gain' },
  'control.speedKi': { unit: 'N·m/rad', doc: 'speed PI integral gain' },
  'control.speedTuning': { unit: '', doc: '{method, a}' },
  'control.speedTuning.method': { unit: '', doc: '"symmetric-optimum" or "bandwidth" (bandwidth needs speedBandwidth_Hz)' },
  'control.speedTuning.a': { unit: '', doc: 'symmetric-optimum spacing a > 1, default 2' },
  'control.antiWindup': { unit: '', doc: '"clamping" or "back-calculation", default "clamping"' },
  'control.decoupling': { unit: '', doc: 'dq decoupling and back-EMF feed-forward, default true' },
  'control.speedPrefilter': { unit: '', doc: 'first-order filter on the speed reference with the speed PI time constant Kp/Ki (tames the symmetric optimum overshoot), default false' },
  'control.speedRamp_rpm_per_s': { unit: 'rpm/s', doc: 'speed reference ramp limit; absent = none' },
  'control.speedLoopDivider': { unit: '', doc: 'speed loop runs every N current periods, default 1' },

  scenario: { unit: '', doc: 'what the simulation does' },
  'scenario.duration_s': { unit: 's', doc: 'simulated time' },
  'scenario.initialSpeed_rpm': { unit: 'rpm', doc: 'speed at t = 0, default 0' },
  'scenario.speedSteps': { unit: '', doc: `speed reference steps [{t_s, speed_rpm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.speedSteps[]': { unit: '', doc: '{t_s, speed_rpm}' },
  'scenario.speedSteps[].t_s': { unit: 's', doc: 'time of the step' },
  'scenario.speedSteps[].speed_rpm': { unit: 'rpm', doc: 'new speed reference' },
  'scenario.torqueSteps': { unit: '', doc: `torque reference steps (torque mode) [{t_s, torque_Nm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.torqueSteps[]': { unit: '', doc: '{t_s, torque_Nm}' },
  'scenario.torqueSteps[].t_s': { unit: 's', doc: 'time of the step' },
  'scenario.torqueSteps[].torque_Nm': { unit: 'N·m', doc: 'new torque reference' },
  'scenario.loadSteps': { unit: '', doc: `load torque steps [{t_s, torque_Nm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.loadSteps[]': { unit: '', doc: '{t_s, torque_Nm}' },
  'scenario.loadSteps[].t_s': { unit: 's', doc: 'time of the step' },
  'scenario.loadSteps[].torque_Nm': { unit: 'N·m', doc: 'new load torque (opposes motoring)' },
  'scenario.loadRamps': { unit: '', doc: `load torque ramps [{t_s, duration_s, torque_Nm}], at most ${MAX_LIST_ENTRIES}` },
  'scenario.loadRamps[]': { unit: '', doc: 'from the load at t_s, linearly to torque_Nm over duration_s' },
  'scenario.loadRamps[].t_s': { unit: 's', doc: 'start of the ramp' },
  'scenario.loadRamps[].duration_s': { unit: 's', doc: 'length of the ramp' },
  'scenario.loadRamps[].torque_Nm': { unit: 'N·m', doc: 'load torque at the end of the ramp' },
  'scenario.loadModel': { unit: '', doc: 'speed-dependent load {kind: "quadratic", k}, T = k omega_m²' },
  'scenario.loadModel.kind': { unit: '', doc: '"quadratic"' },
  'scenario.loadModel.k': { unit: 'N·m·s²/rad²', doc: 'fan or pump coefficient' },
  'scenario.loadInertia': { unit: 'kg·m²', doc: 'inertia of the load, default 0' },
  'scenario.currentStep': { unit: '', doc: 'locked-rotor current step {id_A, iq_A, t_s} (current-step mode)' },
  'scenario.currentStep.id_A': { unit: 'A', doc: 'd-axis current reference after the step (A peak)' },
  'scenario.currentStep.iq_A': { unit: 'A', doc: 'q-axis current reference after the step (A peak)' },
  'scenario.currentStep.t_s': { unit: 's', doc: 'time of the step' },
};

const doc = (path: string): string => {
  const k = KEYS[path];
  return k.unit ? `${k.doc} [${k.unit}]` : k.doc;
};

/** A finite number in [min, max] (or (min, max] with gtMin), documented from KEYS. */
function num(path: string, min: number, max: number, opts: { gtMin?: boolean; int?: boolean } = {}) {
  let s = z.number();
  if (opts.int) s = s.int();
  s = opts.gtMin ? s.gt(min) : s.gte(min);
  return s.lte(max).describe(doc(path));
}
const basis = z.enum(['phase', 'line-to-line']);
const currentBasis = z.enum(['rms', 'peak']);
const T_MIN = -60;
// Lower bounds far below any real machine but far above the denormal numbers that turn a ratio
// such as psiM/Ld or Vdc/psiM into Infinity: inductance 1 nH, flux linkage 1 µWb (or 0, no
// magnet), inertia 1e-9 kg·m² (a 1 mm steel disc is ~1e-13, a bare micro-rotor ~1e-8), Ke/Kt 1e-6.
const L_MIN = 1e-9;
const PSI_MIN = 1e-6;
const J_MIN = 1e-9;
const K_MIN = 1e-6;
const T_MAX = 250;

const motorSchema = z
  .strictObject({
    polePairs: num('motor.polePairs', 1, 200, { int: true }),
    Rs: num('motor.Rs', 0, 1000),
    Ld: num('motor.Ld', L_MIN, 10),
    Lq: num('motor.Lq', L_MIN, 10),
    psiM: num('motor.psiM', 0, 100).refine((v) => v === 0 || v >= PSI_MIN, { message: `must be 0 (no magnet) or >= ${PSI_MIN} Wb` }),
    inertia: num('motor.inertia', J_MIN, 1e5),
    viscousFriction: num('motor.viscousFriction', 0, 1e4).default(0),
    coulombFriction: num('motor.coulombFriction', 0, 1e5).default(0),
    maxSpeed_rpm: num('motor.maxSpeed_rpm', 0, 1e6, { gtMin: true }).optional(),
    ratedCurrent: num('motor.ratedCurrent', 1e-6, 1e6).optional(),
    peakCurrent: num('motor.peakCurrent', 1e-6, 1e6).optional(),
  })
  .superRefine((m, ctx) => {
    if (typeof m.ratedCurrent === 'number' && typeof m.peakCurrent === 'number' && m.ratedCurrent > m.peakCurrent) {
      ctx.addIssue({ code: 'custom', path: ['ratedCurrent'], message: `must be <= motor.peakCurrent (${m.peakCurrent} A)` });
    }
  })
  .describe(doc('motor'));

const lValue = (path: string) => z.strictObject({ value: num(`${path}.value`, L_MIN, 10), basis });
const currentValue = (path: string) => z.strictObject({ value: num(`${path}.value`, 0, 1e5, { gtMin: true }), basis: currentBasis });

const nameplateSchema = z
  .strictObject({
    poles: num('nameplate.poles', 2, 400, { int: true }).optional(),
    polePairs: num('nameplate.polePairs', 1, 200, { int: true }).optional(),
    R: z.strictObject({
      value: num('nameplate.R.value', 0, 1000, { gtMin: true }),
      basis,
      temp_C: num('nameplate.R.temp_C', T_MIN, T_MAX).optional(),
    }),
    L: lValue('nameplate.L').optional(),
    Ld: lValue('nameplate.Ld').optional(),
    Lq: lValue('nameplate.Lq').optional(),
    Ke: z
      .strictObject({
        value: num('nameplate.Ke.value', K_MIN, 1e5),
        unit: z.enum(['V_LL_rms/krpm', 'V_LL_peak/krpm', 'V_ph_peak*s/rad']),
        temp_C: num('nameplate.Ke.temp_C', T_MIN, T_MAX).optional(),
      })
      .optional(),
    Kt: z
      .strictObject({
        value: num('nameplate.Kt.value', K_MIN, 1e5),
        unit: z.enum(['Nm/A_rms', 'Nm/A_peak']),
        temp_C: num('nameplate.Kt.temp_C', T_MIN, T_MAX).optional(),
      })
      .optional(),
    ratedCurrent: currentValue('nameplate.ratedCurrent').optional(),
    peakCurrent: currentValue('nameplate.peakCurrent').optional(),
    ratedSpeed_rpm: num('nameplate.ratedSpeed_rpm', 0, 1e6, { gtMin: true }).optional(),
    ratedTorque_Nm: num('nameplate.ratedTorque_Nm', 0, 1e6, { gtMin: true }).optional(),
    maxSpeed_rpm: num('nameplate.maxSpeed_rpm', 0, 1e6, { gtMin: true }).optional(),
    inertia: num('nameplate.inertia', J_MIN, 1e5),
    viscousFriction: num('nameplate.viscousFriction', 0, 1e4).optional(),
    coulombFriction: num('nameplate.coulombFriction', 0, 1e5).optional(),
  })
  .superRefine((np, ctx) => {
    if (np.poles === undefined && np.polePairs === undefined) ctx.addIssue({ code: 'custom', path: ['poles'], message: 'is required (or polePairs)' });
    if (np.poles !== undefined && np.poles % 2 !== 0) ctx.addIssue({ code: 'custom', path: ['poles'], message: 'must be even (poles, not pole pairs)' });
    if (np.poles !== undefined && np.polePairs !== undefined && np.poles !== 2 * np.polePairs) {
      ctx.addIssue({ code: 'custom', path: ['polePairs'], message: `disagrees with nameplate.poles (${np.poles} poles = ${np.poles / 2} pole pairs)` });
    }
    if (np.L !== undefined && (np.Ld !== undefined || np.Lq !== undefined)) ctx.addIssue({ code: 'custom', path: ['L'], message: 'give either L (surface magnet) or Ld/Lq, not both' });
    if (np.L === undefined && np.Ld === undefined) ctx.addIssue({ code: 'custom', path: ['Ld'], message: 'is required (or L for a surface-magnet motor), H' });
    if (np.Ke === undefined && np.Kt === undefined) ctx.addIssue({ code: 'custom', path: ['Ke'], message: 'is required (or Kt), a back-EMF constant' });
  })
  .describe(doc('nameplate'));

const inverterSchema = z
  .strictObject({
    Vdc: num('inverter.Vdc', 0, 1e5, { gtMin: true }),
    Imax: num('inverter.Imax', 1e-6, 1e6),
    Icont: num('inverter.Icont', 1e-6, 1e6),
    modulation: z.enum(['sinusoidal', 'svpwm', 'six-step']).optional(), // "svpwm" when absent, said as a finding
    voltageUtilization: num('inverter.voltageUtilization', 1e-3, 1).default(1),
    deviceDrop: num('inverter.deviceDrop', 0, 1e3).default(0),
  })
  .superRefine((inv, ctx) => {
    if (!(inv.Vdc > 0 && inv.Imax > 0 && inv.Icont > 0)) return;
    if (inv.Icont > inv.Imax) ctx.addIssue({ code: 'custom', path: ['Icont'], message: `must be <= inverter.Imax (${inv.Imax} A)` });
    if (2 * inv.deviceDrop >= inv.Vdc) ctx.addIssue({ code: 'custom', path: ['deviceDrop'], message: `must be < half of inverter.Vdc (${inv.Vdc / 2} V)` });
  })
  .describe(doc('inverter'));

const conditionsSchema = z
  .strictObject({
    windingTemp_C: num('conditions.windingTemp_C', T_MIN, T_MAX).optional(), // 20 °C when absent, said as a finding
    magnetTemp_C: num('conditions.magnetTemp_C', T_MIN, T_MAX).default(20),
    coldTemp_C: num('conditions.coldTemp_C', T_MIN, T_MAX).optional(), // 20 °C when absent, said as a finding
    magnetTempCoeff: num('conditions.magnetTempCoeff', -0.003, 0.001).default(-0.0012),
  })
  .describe(doc('conditions'));

/** The conditions of a file that gives none, from the schema's own defaults (every temperature 20 °C then). */
export function defaultConditions(): ProjectConditions {
  return conditionsSchema.parse({});
}
export type ProjectConditions = z.output<typeof conditionsSchema>;

const requirementSchema = z.strictObject({
  label: z.string().min(1).max(200),
  speed_rpm: num('requirements[].speed_rpm', 0, 1e6),
  torque_Nm: num('requirements[].torque_Nm', -1e6, 1e6),
  duty: z.enum(['peak', 'continuous']).optional(), // 'peak' when absent
});

const controlSchema = z
  .strictObject({
    mode: z.enum(['speed', 'torque', 'current-step']).default('speed'),
    fCtrl_Hz: num('control.fCtrl_Hz', 100, 1e6).default(10000),
    delaySamples: num('control.delaySamples', 0, 10, { int: true }).default(1),
    currentBandwidth_Hz: num('control.currentBandwidth_Hz', 1e-3, 1e5).optional(),
    currentKp: num('control.currentKp', 0, 1e6, { gtMin: true }).optional(),
    currentKi: num('control.currentKi', 0, 1e10, { gtMin: true }).optional(),
    speedBandwidth_Hz: num('control.speedBandwidth_Hz', 1e-3, 1e4).optional(),
    speedKp: num('control.speedKp', 0, 1e6, { gtMin: true }).optional(),
    speedKi: num('control.speedKi', 0, 1e9, { gtMin: true }).optional(),
    speedTuning: z
      .strictObject({
        method: z.enum(['symmetric-optimum', 'bandwidth']),
        a: num('control.speedTuning.a', 1, 100, { gtMin: true }).default(2),
      })
      .optional(),
    antiWindup: z.enum(['clamping', 'back-calculation']).default('clamping'),
    decoupling: z.boolean().default(true),
    speedPrefilter: z.boolean().default(false),
    speedRamp_rpm_per_s: num('control.speedRamp_rpm_per_s', 0, 1e8, { gtMin: true }).optional(),
    speedLoopDivider: num('control.speedLoopDivider', 1, 1000, { int: true }).default(1),
  })
  .superRefine((c, ctx) => {
    const bad = (path: string, message: string): void => ctx.addIssue({ code: 'custom', path: [path], message });
    if (c.currentBandwidth_Hz !== undefined && (c.currentKp !== undefined || c.currentKi !== undefined)) {
      bad('currentBandwidth_Hz', 'give either currentBandwidth_Hz or currentKp/currentKi, not both');
    }
    if ((c.currentKp === undefined) !== (c.currentKi === undefined)) bad(c.currentKp === undefined ? 'currentKp' : 'currentKi', 'must be given together with the other current gain');
    const gains = c.speedKp !== undefined || c.speedKi !== undefined;
    if ((c.speedKp === undefined) !== (c.speedKi === undefined)) bad(c.speedKp === undefined ? 'speedKp' : 'speedKi', 'must be given together with the other speed gain');
    if (gains && (c.speedBandwidth_Hz !== undefined || c.speedTuning !== undefined)) bad('speedKp', 'give speed gains, or speedBandwidth_Hz / speedTuning, not both');
    if (c.speedTuning?.method === 'symmetric-optimum' && c.speedBandwidth_Hz !== undefined) {
      bad('speedBandwidth_Hz', 'is set by the symmetric optimum; leave it out or use speedTuning.method "bandwidth"');
    }
    if (c.speedTuning?.method === 'bandwidth' && c.speedBandwidth_Hz === undefined) bad('speedBandwidth_Hz', 'is required by speedTuning.method "bandwidth", Hz');
  })
  .describe('the drive controller');

const stepT = (path: string) => num(path, 0, 1e5);
const scenarioSchema = z
  .strictObject({
    duration_s: num('scenario.duration_s', 0, 3600, { gtMin: true }),
    initialSpeed_rpm: num('scenario.initialSpeed_rpm', -1e6, 1e6).default(0),
    speedSteps: z.array(z.strictObject({ t_s: stepT('scenario.speedSteps[].t_s'), speed_rpm: num('scenario.speedSteps[].speed_rpm', -1e6, 1e6) })).max(MAX_LIST_ENTRIES).default([]),
    torqueSteps: z.array(z.strictObject({ t_s: stepT('scenario.torqueSteps[].t_s'), torque_Nm: num('scenario.torqueSteps[].torque_Nm', -1e6, 1e6) })).max(MAX_LIST_ENTRIES).default([]),
    loadSteps: z.array(z.strictObject({ t_s: stepT('scenario.loadSteps[].t_s'), torque_Nm: num('scenario.loadSteps[].torque_Nm', -1e6, 1e6) })).max(MAX_LIST_ENTRIES).default([]),
    loadRamps: z
      .array(
        z.strictObject({
          t_s: stepT('scenario.loadRamps[].t_s'),
          duration_s: num('scenario.loadRamps[].duration_s', 0, 1e5, { gtMin: true }),
          torque_Nm: num('scenario.loadRamps[].torque_Nm', -1e6, 1e6),
        }),
      )
      .max(MAX_LIST_ENTRIES)
      .default([]),
    loadModel: z.strictObject({ kind: z.literal('quadratic'), k: num('scenario.loadModel.k', 0, 1e6) }).optional(),
    loadInertia: num('scenario.loadInertia', 0, 1e5).default(0),
    currentStep: z
      .strictObject({
        id_A: num('scenario.currentStep.id_A', -1e6, 1e6),
        iq_A: num('scenario.currentStep.iq_A', -1e6, 1e6),
        t_s: stepT('scenario.currentStep.t_s'),
      })
      .optional(),
  })
  .superRefine((s, ctx) => {
    const lists = ['speedSteps', 'torqueSteps', 'loadSteps', 'loadRamps'] as const;
    if (!(s.duration_s > 0)) return;
    for (const key of lists) {
      if (!Array.isArray(s[key])) continue;
      s[key].forEach((e, i) => {
        if (typeof e?.t_s !== 'number') return;
        if (e.t_s > s.duration_s) ctx.addIssue({ code: 'custom', path: [key, i, 't_s'], message: `must be <= scenario.duration_s (${s.duration_s} s)` });
        if (i > 0 && e.t_s < (s[key][i - 1]?.t_s ?? -Infinity)) ctx.addIssue({ code: 'custom', path: [key, i, 't_s'], message: 'must not be earlier than the step before it' });
      });
    }
    if (s.currentStep && typeof s.currentStep.t_s === 'number' && s.currentStep.t_s > s.duration_s) ctx.addIssue({ code: 'custom', path: ['currentStep', 't_s'], message: `must be <= scenario.duration_s (${s.duration_s} s)` });
  })
  .describe('what the simulation does');

const projectObject = z.strictObject({
  format: z.literal(PROJECT_FORMAT),
  version: z.literal(PROJECT_VERSION),
  name: z.string().max(500).default(''),
  note: z.string().max(20000).default(''),
  motor: motorSchema.optional(),
  nameplate: nameplateSchema.optional(),
  inverter: inverterSchema,
  conditions: conditionsSchema.optional(), // every temperature 20 °C when absent, said as a finding
  requirements: z.array(requirementSchema).max(MAX_LIST_ENTRIES).default([]),
  control: controlSchema.optional(),
  scenario: scenarioSchema.optional(),
});

const CHOOSE_ONE = 'and motor are both given: choose one, motor (the dq model) or nameplate (datasheet terms), and remove the other';

export const projectSchema = projectObject.superRefine((p, ctx) => {
  if (p.motor === undefined && p.nameplate === undefined) ctx.addIssue({ code: 'custom', path: ['motor'], message: 'is required (or a nameplate section)' });
  if (p.motor !== undefined && p.nameplate !== undefined) ctx.addIssue({ code: 'custom', path: ['nameplate'], message: CHOOSE_ONE });
  if (p.control?.mode === 'current-step' && p.scenario !== undefined && p.scenario.currentStep === undefined) {
    ctx.addIssue({ code: 'custom', path: ['scenario', 'currentStep'], message: 'is required by control.mode "current-step"' });
  }
  if (p.control?.mode === 'current-step' && p.scenario?.currentStep !== undefined) {
    const { id_A, iq_A } = p.scenario.currentStep;
    if (p.inverter?.Imax > 0 && Math.hypot(id_A, iq_A) > p.inverter.Imax) {
      ctx.addIssue({ code: 'custom', path: ['scenario', 'currentStep'], message: `asks for ${Math.hypot(id_A, iq_A).toPrecision(4)} A, above inverter.Imax (${p.inverter.Imax} A)` });
    }
  }
});

export type ProjectFile = z.output<typeof projectSchema>;
export type MotorSection = z.output<typeof motorSchema>;
export type NameplateSection = z.output<typeof nameplateSchema>;
export type ControlSection = z.output<typeof controlSchema>;
export type ScenarioSection = z.output<typeof scenarioSchema>;

// The nameplate section must be usable as a Nameplate as it is.
const _nameplateFits = (x: NameplateSection): Nameplate => x;
void _nameplateFits;

export interface ProjectProblem {
  /** project path, e.g. "motor.Ld" or "requirements[2].speed_rpm" ("file" for the whole file) */
  path: string;
  /** what is wrong, without the path, e.g. "must be > 0 H" */
  message: string;
}

/** "requirements.2.speed_rpm" style zod path -> "requirements[2].speed_rpm" and its KEYS pattern */
function pathOf(segments: readonly PropertyKey[]): { shown: string; pattern: string } {
  let shown = '';
  let pattern = '';
  for (const s of segments) {
    if (typeof s === 'number') {
      shown += `[${s}]`;
      pattern += '[]';
    } else {
      const k = String(s);
      shown += shown ? `.${k}` : k;
      pattern += pattern ? `.${k}` : k;
    }
  }
  return { shown, pattern };
}

const unitOf = (pattern: string): string => KEYS[pattern]?.unit ?? '';
const withUnit = (text: string, unit: string): string => (unit ? `${text} ${unit}` : text);
const fmtLimit = (x: number | bigint): string => String(x);

function known(prefix: string): string[] {
  const out: string[] = [];
  for (const k of Object.keys(KEYS)) {
    if (prefix === '' ? !k.includes('.') && !k.includes('[') : k.startsWith(`${prefix}.`) && !k.slice(prefix.length + 1).includes('.') && !k.slice(prefix.length + 1).includes('[')) {
      out.push(prefix === '' ? k : k.slice(prefix.length + 1));
    }
  }
  return out;
}

const TYPE_WORD: Record<string, string> = {
  number: 'a number',
  int: 'a whole number',
  string: 'text',
  boolean: 'true or false',
  object: 'an object { ... }',
  array: 'a list [ ... ]',
};

/** Our own phrasing of one zod issue. */
function phrase(iss: z.core.$ZodIssue, input: unknown): ProjectProblem[] {
  const { shown, pattern } = pathOf(iss.path);
  const unit = unitOf(pattern);
  const at = (m: string): ProjectProblem[] => [{ path: shown || 'file', message: m }];
  switch (iss.code) {
    case 'invalid_type': {
      if (iss.expected === 'int') return at('must be a whole number');
      const value = lookup(input, iss.path);
      if (value === undefined) {
        const d = KEYS[pattern];
        return at(d ? `is required (${withUnit(d.doc, unit ? `in ${unit}` : '').trim()})` : 'is required');
      }
      if (iss.expected === 'number' && typeof value === 'number') return at(withUnit('must be a finite number', unit ? `in ${unit}` : ''));
      if (iss.expected === 'number' && value !== null && typeof value === 'object' && !Array.isArray(value) && ('value' in value || 'basis' in value)) return at(withBasisMessage(value as Record<string, unknown>, unit));
      return at(`must be ${TYPE_WORD[iss.expected] ?? iss.expected}${unit && iss.expected === 'number' ? ` in ${unit}` : ''}`);
    }
    case 'too_small':
      if (iss.origin === 'string') return at('must not be empty');
      if (iss.origin === 'array') return at(`must have at least ${fmtLimit(iss.minimum)} entries`);
      return at(withUnit(`must be ${iss.inclusive ? '>=' : '>'} ${fmtLimit(iss.minimum)}`, unit));
    case 'too_big':
      if (iss.origin === 'string') return at(`must be at most ${fmtLimit(iss.maximum)} characters`);
      if (iss.origin === 'array') return at(`must have at most ${fmtLimit(iss.maximum)} entries`);
      return at(withUnit(`must be ${iss.inclusive ? '<=' : '<'} ${fmtLimit(iss.maximum)}`, unit));
    case 'unrecognized_keys':
      return iss.keys.map((key) => {
        const allowed = known(pattern);
        // a runaway key (pasted text) is shown by its start and length, so the message stays one short line
        const k = key.length > 60 ? `${key.slice(0, 40)}… (${key.length} characters)` : key;
        return {
          path: shown ? `${shown}.${k}` : k,
          message: `is not a known key${allowed.length ? ` (known here: ${allowed.join(', ')})` : ''}`,
        };
      });
    case 'invalid_value':
      if (iss.values.length === 1) return at(`must be ${JSON.stringify(iss.values[0])}`);
      return at(`must be one of ${iss.values.map((v) => JSON.stringify(v)).join(', ')}`);
    case 'custom':
      return at(iss.message);
    default:
      return at('is not valid here');
  }
}

/** A {value, basis} object where a plain number belongs: where a basis is accepted, and what the number means here. */
function withBasisMessage(v: Record<string, unknown>, unit: string): string {
  if (unit === 'A') {
    const x = v['value'];
    const asPeak = typeof x === 'number' && Number.isFinite(x) && v['basis'] === 'rms' ? ` (${x} A rms = ${Number((x * Math.SQRT2).toPrecision(4))} A peak)` : '';
    return `must be a plain number in A peak${asPeak}: a current with a basis {value, basis} ("rms" or "peak") is accepted only in nameplate.ratedCurrent and nameplate.peakCurrent; everywhere else a current is a number in A peak`;
  }
  return `must be a plain number${unit ? ` in ${unit}` : ''}: {value, basis} objects belong to the nameplate section only`;
}

function lookup(root: unknown, path: readonly PropertyKey[]): unknown {
  let x: unknown = root;
  for (const s of path) {
    if (x === null || typeof x !== 'object') return undefined;
    x = (x as Record<PropertyKey, unknown>)[s as string];
  }
  return x;
}

/** A version or format check before the schema, so a newer file gets a plain message. */
function headerProblem(json: unknown): ProjectProblem | null {
  if (json === null || typeof json !== 'object' || Array.isArray(json)) return { path: 'file', message: 'must be a JSON object { ... }' };
  const o = json as Record<string, unknown>;
  if (o.format !== PROJECT_FORMAT) {
    return { path: 'format', message: `must be "${PROJECT_FORMAT}" (this is not a Torquewise project file)` };
  }
  if (typeof o.version === 'number' && Number.isInteger(o.version) && o.version > PROJECT_VERSION) {
    return { path: 'version', message: `is ${o.version}: the file was written by a newer Torquewise (version ${o.version}); this one reads version ${PROJECT_VERSION}` };
  }
  if (o.version !== PROJECT_VERSION) return { path: 'version', message: `must be ${PROJECT_VERSION}` };
  return null;
}

/**
 * A list longer than MAX_LIST_ENTRIES, found by its length alone (no entry is read): checked
 * before the schema looks at any entry, and by the app before it lays a file out in its form.
 */
export function listCapProblem(json: unknown): ProjectProblem | null {
  for (const path of CAPPED_LISTS) {
    let x: unknown = json;
    for (const k of path) x = x !== null && typeof x === 'object' && !Array.isArray(x) ? (x as Record<string, unknown>)[k] : undefined;
    if (Array.isArray(x) && x.length > MAX_LIST_ENTRIES) return { path: path.join('.'), message: `must have at most ${MAX_LIST_ENTRIES} entries (it has ${x.length})` };
  }
  return null;
}

/**
 * The problems of zod's issues in our words; giving both motor and nameplate leads (zod runs the
 * file-level check only when the sections themselves are valid, and the rest follows from it).
 */
function problemsOf(issues: readonly z.core.$ZodIssue[], json: unknown): ProjectProblem[] {
  const out = issues.flatMap((iss) => phrase(iss, json));
  const o = json as Record<string, unknown>;
  if (o['motor'] !== undefined && o['nameplate'] !== undefined && !out.some((p) => p.path === 'nameplate' && p.message === CHOOSE_ONE)) {
    out.unshift({ path: 'nameplate', message: CHOOSE_ONE });
  }
  return out;
}

/** Every problem of a project file, in file order (empty = valid). */
export function checkProject(json: unknown): ProjectProblem[] {
  const h = headerProblem(json) ?? listCapProblem(json);
  if (h) return [h];
  const r = projectSchema.safeParse(json);
  if (r.success) return [];
  return problemsOf(r.error.issues, json);
}

/** Most problems one refusal lists (a file with more gets "... and N more"). */
export const MAX_PROBLEMS = 20;

/**
 * Validate and fill defaults; throws one InputError carrying every problem (up to MAX_PROBLEMS),
 * each naming its field: `field`/`message` are the first, `problems` all of them.
 */
export function parseProject(json: unknown): ProjectFile {
  const h = headerProblem(json) ?? listCapProblem(json);
  if (h) throw new InputError(h.path, h.message);
  const r = projectSchema.safeParse(json);
  if (r.success) return r.data;
  const all = problemsOf(r.error.issues, json);
  const first = all[0] ?? { path: 'file', message: 'is not valid here' };
  throw new InputError(first.path, first.message, all.slice(0, MAX_PROBLEMS), Math.max(0, all.length - MAX_PROBLEMS));
}

/** The control section of a file that gives none, from the schema's own defaults. */
export function defaultControl(): ControlSection {
  return controlSchema.parse({});
}

/**
 * The project file: `{"format": "torquewise-project", "version": 1, ...}`, as zod sections with
 * their bounds and defaults (every default of a project lives here, once). The key documentation is
 * in schema-keys.ts, the phrasing of problems in schema-problems.ts; both are re-exported here.
 * Messages are our own phrasing, e.g. `motor.Ld must be > 0 H`.
 */
import { z } from 'zod';
import { InputError } from '../base/errors';
import type { Nameplate } from '../machine/nameplate';
import { KEYS, keyDoc as doc, MAX_LIST_ENTRIES, PROJECT_FORMAT, PROJECT_VERSION } from './schema-keys';
import { fluxMapCapProblem, fluxMapCoverageProblems, fluxMapSchema } from './flux-map-schema';
import { lossesSchema } from './loss-schema';
import { thermalCapProblem, thermalSchema } from './thermal-schema';
import { dutyCycleCapProblem, dutyCycleSchema } from './duty-cycle-schema';
import { pwmProblems, pwmSchema } from './pwm-schema';
import { switchingWindowProblems } from './switching-window';
import { angleSchema } from './angle-schema';
import { tolerancesSchema } from './tolerance-schema';
import { variantsSchema } from './variant-schema';
import { CHOOSE_ONE, headerProblem, listCapProblem, problemsOf, type ProjectProblem } from './schema-problems';

/**
 * How every project schema is parsed: zod's own object parsing, without the parser it otherwise
 * generates and compiles per object schema on first use (the same result; measured on the traction
 * demo, the first parse about 7 ms instead of 30 ms and a repeated one 0.2 ms instead of 0.4 ms).
 */
export const PARSE_OPTIONS = { jitless: true } as const;

export { CAPPED_LISTS, KEYS, MAX_LIST_ENTRIES, MAX_PROJECT_BYTES, PROJECT_FORMAT, PROJECT_VERSION } from './schema-keys';
export { listCapProblem, type ProjectProblem } from './schema-problems';

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

/**
 * What a file that leaves them out is taken to have, each said as a finding when it is assumed:
 * every temperature of a file without conditions, the hot winding's and the cold corner's when
 * absent, and the hot magnet's (the conditions' default), °C; the modulation when absent.
 */
export const DEFAULT_TEMP_C = 20;
export const DEFAULT_COLD_TEMP_C = 20;
export const DEFAULT_MODULATION = 'svpwm' as const;
/** The duty of a requirement that gives none: checked against the peak current limit. */
export const DEFAULT_DUTY = 'peak' as const;

const motorSchema = z
  .strictObject({
    polePairs: num('motor.polePairs', 1, 200, { int: true }),
    Rs: num('motor.Rs', 0, 1000),
    // the constant dq terms, or a flux map instead (fluxMapChoice says which is missing or doubled)
    Ld: num('motor.Ld', L_MIN, 10).optional(),
    Lq: num('motor.Lq', L_MIN, 10).optional(),
    psiM: num('motor.psiM', 0, 100).refine((v) => v === 0 || v >= PSI_MIN, { message: `must be 0 (no magnet) or >= ${PSI_MIN} Wb` }).optional(),
    fluxMap: fluxMapSchema.optional(),
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
  // run whatever else is wrong with the section, so a missing Ld is listed with the other problems
  .superRefine(fluxMapChoice, { when: (payload) => payload.value !== null && typeof payload.value === 'object' && !Array.isArray(payload.value) })
  .describe(doc('motor'));

/** Either the constant Ld, Lq, psiM or motor.fluxMap: neither, both, or a part of the constant terms is refused, naming the field. */
function fluxMapChoice(m: { Ld?: unknown; Lq?: unknown; psiM?: unknown; fluxMap?: unknown }, ctx: z.RefinementCtx): void {
  const constant = (['Ld', 'Lq', 'psiM'] as const).filter((k) => m[k] !== undefined);
  if (m.fluxMap !== undefined) {
    if (constant.length > 0) {
      ctx.addIssue({ code: 'custom', path: ['fluxMap'], message: `and ${constant.map((k) => `motor.${k}`).join(', ')} are both given: give either the flux map or the constant Ld, Lq and psiM, and remove the other` });
    }
    return;
  }
  for (const k of ['Ld', 'Lq', 'psiM'] as const) {
    if (m[k] !== undefined) continue;
    const d = KEYS[`motor.${k}`]!;
    ctx.addIssue({ code: 'custom', path: [k], message: `is required (${d.doc} in ${d.unit}${constant.length === 0 ? '), or give motor.fluxMap instead of Ld, Lq and psiM' : ')'}` });
  }
}

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
    magnetTemp_C: num('conditions.magnetTemp_C', T_MIN, T_MAX).default(DEFAULT_TEMP_C),
    coldTemp_C: num('conditions.coldTemp_C', T_MIN, T_MAX).optional(), // 20 °C when absent, said as a finding
    magnetTempCoeff: num('conditions.magnetTempCoeff', -0.003, 0.001).default(-0.0012),
  })
  .describe(doc('conditions'));

/** The conditions of a file that gives none, from the schema's own defaults (every temperature 20 °C then). */
export function defaultConditions(): ProjectConditions {
  return conditionsSchema.parse({}, PARSE_OPTIONS);
}
export type ProjectConditions = z.output<typeof conditionsSchema>;

const requirementSchema = z.strictObject({
  label: z.string().min(1).max(200),
  speed_rpm: num('requirements[].speed_rpm', 0, 1e6),
  torque_Nm: num('requirements[].torque_Nm', -1e6, 1e6),
  duty: z.enum(['peak', 'continuous']).optional(), // DEFAULT_DUTY when absent
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
    pwm: pwmSchema.optional(), // the averaged inverter when absent
    angle: angleSchema.optional(), // the true angle and speed ("ideal") when absent
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
  losses: lossesSchema.optional(), // every loss zero when absent
  thermal: thermalSchema.optional(), // no thermal rating when absent
  dutyCycle: dutyCycleSchema.optional(),
  tolerances: tolerancesSchema.optional(), // no tolerance study when absent
  variants: variantsSchema.optional(), // no variants when absent
});

export const projectSchema = projectObject.superRefine((p, ctx) => {
  if (p.motor === undefined && p.nameplate === undefined) ctx.addIssue({ code: 'custom', path: ['motor'], message: 'is required (or a nameplate section)' });
  if (p.motor !== undefined && p.nameplate !== undefined) ctx.addIssue({ code: 'custom', path: ['nameplate'], message: CHOOSE_ONE });
  const map = p.motor?.fluxMap;
  if (map !== undefined && p.inverter.Imax > 0) {
    const motorPeak = p.motor?.peakCurrent;
    const Ipk = motorPeak !== undefined && motorPeak < p.inverter.Imax ? motorPeak : p.inverter.Imax;
    const words = motorPeak !== undefined && motorPeak < p.inverter.Imax ? 'motor.peakCurrent, below inverter.Imax' : 'inverter.Imax';
    for (const c of fluxMapCoverageProblems(map, Ipk, words)) ctx.addIssue({ code: 'custom', path: ['motor', 'fluxMap', c.key], message: c.message });
  }
  for (const c of pwmProblems(p.control, p.inverter.Vdc)) ctx.addIssue({ code: 'custom', path: c.path, message: c.message });
  for (const c of switchingWindowProblems(p.control?.pwm, p.scenario)) ctx.addIssue({ code: 'custom', path: c.path, message: c.message });
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
export type { FluxMapSection } from './flux-map-schema';
export { MAX_FLUX_MAP_POINTS, fluxMapCapProblem } from './flux-map-schema';
export type NameplateSection = z.output<typeof nameplateSchema>;
export type ControlSection = z.output<typeof controlSchema>;
export type ScenarioSection = z.output<typeof scenarioSchema>;
export type { InverterLossSection, IronLossSection, LossesSection, WindageSection } from './loss-schema';
export { DEFAULT_IRON_BETA } from './loss-schema';
export type { ThermalSection } from './thermal-schema';
export type { DutyCycleSection } from './duty-cycle-schema';
export type { PwmSection } from './pwm-schema';
export type { MonteCarloSettings, ToleranceBand, TolerancePath, TolerancesSection } from './tolerance-schema';
export type { VariantsSection } from './variant-schema';
export { MAX_DUTY_CYCLE_SAMPLES } from './duty-cycle-schema';

// The nameplate section must be usable as a Nameplate as it is.
const _nameplateFits = (x: NameplateSection): Nameplate => x;
void _nameplateFits;

/** Every problem of a project file, in file order (empty = valid). */
export function checkProject(json: unknown): ProjectProblem[] {
  const h = headerProblem(json) ?? listCapProblem(json) ?? fluxMapCapProblem(json) ?? thermalCapProblem(json) ?? dutyCycleCapProblem(json);
  if (h) return [h];
  const r = projectSchema.safeParse(json, PARSE_OPTIONS);
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
  const h = headerProblem(json) ?? listCapProblem(json) ?? fluxMapCapProblem(json) ?? thermalCapProblem(json) ?? dutyCycleCapProblem(json);
  if (h) throw new InputError(h.path, h.message);
  const r = projectSchema.safeParse(json, PARSE_OPTIONS);
  if (r.success) return r.data;
  const all = problemsOf(r.error.issues, json);
  const first = all[0] ?? { path: 'file', message: 'is not valid here' };
  throw new InputError(first.path, first.message, all.slice(0, MAX_PROBLEMS), Math.max(0, all.length - MAX_PROBLEMS));
}

/** The control section of a file that gives none, from the schema's own defaults. */
export function defaultControl(): ControlSection {
  return controlSchema.parse({}, PARSE_OPTIONS);
}

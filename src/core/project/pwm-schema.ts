/**
 * The `control.pwm` section of a project file: how the simulator models the inverter's pulse-width
 * modulation. "model": "average" (the default: the controller's voltage applied as the period's mean)
 * or "switching" (each carrier period split at the legs' switching instants); "fsw_Hz" the carrier
 * frequency (control.fCtrl_Hz when absent; the control rate must be one or two times it);
 * "deadTime_s" (default 0); "modulation" "sinusoidal", "svpwm" (min-max injection, centred
 * space-vector PWM) or "dpwm1" (discontinuous, one leg clamped per 60°), from inverter.modulation
 * when absent ("sinusoidal" stays, "svpwm" and "six-step" give "svpwm"); "deviceDrop" the on-state
 * drop of a conducting switch or diode (inverter.deviceDrop when absent); "window_s" {from, to} the
 * switching model's zoom window of full-resolution traces, s (the last two fundamental periods of
 * the run when absent; at most WINDOW_CAPACITY samples are kept); "windowAt" where the window sits
 * without window_s: "end" (the default) or "load-step" (around the first load event, see
 * switching-window.ts); "deadTimeCompensation" (default false) the modulator's correction of the
 * dead time and the device drop by the sign of each phase current (see pwm-from-project.ts for its
 * band). The checks across
 * sections (rates, dead time against the carrier period, drop against the bus) are `pwmProblems`.
 */
import { z } from 'zod';
import { keyDoc as doc } from './schema-keys';

function num(path: string, min: number, max: number, opts: { gtMin?: boolean } = {}) {
  const s = opts.gtMin ? z.number().gt(min) : z.number().gte(min);
  return s.lte(max).describe(doc(path));
}

export const PWM_MODULATIONS = ['sinusoidal', 'svpwm', 'dpwm1'] as const;

export const pwmSchema = z
  .strictObject({
    model: z.enum(['average', 'switching']).default('average').describe(doc('control.pwm.model')),
    fsw_Hz: num('control.pwm.fsw_Hz', 100, 1e6).optional(), // control.fCtrl_Hz when absent
    deadTime_s: num('control.pwm.deadTime_s', 0, 1e-3).default(0),
    modulation: z.enum(PWM_MODULATIONS).optional().describe(doc('control.pwm.modulation')), // from inverter.modulation when absent
    deviceDrop: num('control.pwm.deviceDrop', 0, 1e3).optional(), // inverter.deviceDrop when absent
    deadTimeCompensation: z.boolean().optional().describe(doc('control.pwm.deadTimeCompensation')), // off when absent (overrides typed by the output keep working without it)
    // the switching model's zoom window; the last two fundamental periods of the run when absent
    window_s: z
      .strictObject({ from: num('control.pwm.window_s.from', 0, 1e5), to: num('control.pwm.window_s.to', 0, 1e5) })
      .optional()
      .describe(doc('control.pwm.window_s')),
    // where the zoom window sits when window_s is not given: "end" (as when absent) or "load-step" (switching-window.ts)
    windowAt: z.enum(['end', 'load-step']).optional().describe(doc('control.pwm.windowAt')),
  })
  .describe(doc('control.pwm'));

export type PwmSection = z.output<typeof pwmSchema>;

/** The carrier frequency of a control section: control.pwm.fsw_Hz, or the control rate when absent, Hz. */
export function carrierFrequency(control: { fCtrl_Hz: number; pwm?: { fsw_Hz?: number | undefined } | undefined }): number {
  return control.pwm?.fsw_Hz ?? control.fCtrl_Hz;
}

/**
 * The problems of control.pwm that depend on other sections, each with its path from the project
 * root: the control rate one or two times the carrier frequency; the dead time below a quarter of the
 * carrier period; the zoom window's end after its start; the device drop below half the bus.
 */
export function pwmProblems(control: { fCtrl_Hz: number; pwm?: PwmSection | undefined } | undefined, Vdc: number): { path: (string | number)[]; message: string }[] {
  const pwm = control?.pwm;
  if (!control || !pwm) return [];
  const out: { path: (string | number)[]; message: string }[] = [];
  const fsw = carrierFrequency(control);
  const ratio = control.fCtrl_Hz / fsw;
  if (pwm.fsw_Hz !== undefined && !(Math.abs(ratio - 1) < 1e-9 || Math.abs(ratio - 2) < 1e-9)) {
    out.push({ path: ['control', 'pwm', 'fsw_Hz'], message: `must be control.fCtrl_Hz (${control.fCtrl_Hz} Hz, one control update per carrier period) or half of it (${control.fCtrl_Hz / 2} Hz, two updates)` });
  }
  if (pwm.deadTime_s >= 0.25 / fsw) {
    out.push({ path: ['control', 'pwm', 'deadTime_s'], message: `must be below a quarter of the carrier period (${(0.25e6 / fsw).toPrecision(3)} µs at ${fsw} Hz)` });
  }
  if (pwm.window_s !== undefined && !(pwm.window_s.to > pwm.window_s.from)) {
    out.push({ path: ['control', 'pwm', 'window_s', 'to'], message: `must be > control.pwm.window_s.from (${pwm.window_s.from} s)` });
  }
  if (pwm.deviceDrop !== undefined && Vdc > 0 && 2 * pwm.deviceDrop >= Vdc) {
    out.push({ path: ['control', 'pwm', 'deviceDrop'], message: `must be < half of inverter.Vdc (${Vdc / 2} V)` });
  }
  return out;
}

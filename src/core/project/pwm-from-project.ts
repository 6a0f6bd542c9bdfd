/**
 * The PWM specification of a project (../drive/pwm-spec.ts) for the simulator, from its control
 * section (schema defaults; `control.pwm` absent = the averaged inverter) and its inverter: the
 * carrier frequency (the control rate when absent) and the updates per carrier period, the
 * modulation (from inverter.modulation when absent: "sinusoidal" stays, "svpwm" and "six-step" give
 * min-max "svpwm", which clips into the hexagon as six-step does), the device drop (the inverter's
 * when absent), the bus. The phase current that counts as zero for the dead time and the drop is a
 * ten-thousandth of the peak current limit. The zoom window (control.pwm.window_s, or windowAt
 * "load-step" placed on the scenario's first load event: switching-window.ts) when given.
 * With control.pwm.deadTimeCompensation the modulator corrects each leg's duty by the sign of its
 * phase current, linear across a band of COMPENSATION_BAND_FRACTION of the peak current limit
 * (about the current ripple, where the sampled current's sign does not say which diode conducts).
 */
import { InputError } from '../base/errors';
import type { PwmSpec } from '../drive/pwm-spec';
import type { ResolvedProject } from './project';
import type { ControlSection, ScenarioSection } from './schema';
import { switchingWindow, switchingWindowProblems } from './switching-window';
import { carrierFrequency, pwmProblems } from './pwm-schema';

/** The phase current below which the switching model counts a current as zero, per ampere of the peak limit. */
export const ZERO_CURRENT_FRACTION = 1e-4;

/** The dead-time compensation's band about zero current, per ampere of the peak limit. */
export const COMPENSATION_BAND_FRACTION = 0.02;

export function pwmFromProject(p: ResolvedProject, control: ControlSection, scenario: ScenarioSection | undefined = p.file.scenario): PwmSpec {
  // the same checks as the schema's, for a control section or scenario changed after parsing (overrides)
  const bad = [...pwmProblems(control, p.inverter.Vdc), ...switchingWindowProblems(control.pwm, scenario)][0];
  if (bad) throw new InputError(bad.path.join('.'), bad.message);
  const pwm = control.pwm;
  const fsw = carrierFrequency(control);
  const window = switchingWindow(pwm, scenario, fsw, p.machine20.polePairs);
  return {
    model: pwm?.model ?? 'average',
    fsw_Hz: fsw,
    updatesPerPeriod: Math.abs(control.fCtrl_Hz / fsw - 2) < 1e-9 ? 2 : 1,
    deadTime_s: pwm?.deadTime_s ?? 0,
    modulation: pwm?.modulation ?? (p.inverter.modulation === 'sinusoidal' ? 'sinusoidal' : 'svpwm'),
    Vdc: p.inverter.Vdc,
    deviceDrop_V: pwm?.deviceDrop ?? p.inverter.deviceDrop,
    zeroCurrent_A: ZERO_CURRENT_FRACTION * p.peak.Imax,
    ...(pwm?.deadTimeCompensation ? { compensation: { band_A: COMPENSATION_BAND_FRACTION * p.peak.Imax } } : {}),
    ...(window ? { window } : {}),
  };
}

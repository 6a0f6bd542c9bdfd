// The PwmSpec of a project (src/core/project/pwm-from-project.ts) and its place in the simulation setup.
import { describe, expect, it } from 'vitest';
import { demoJson, messageOf } from './helpers';
import { parseProject, defaultControl } from '../src/core/project/schema';
import { resolveProject } from '../src/core/project/project';
import { COMPENSATION_BAND_FRACTION, pwmFromProject, ZERO_CURRENT_FRACTION } from '../src/core/project/pwm-from-project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';

const traction = () => resolveProject(parseProject(demoJson('demo-ipm-traction')));

describe('pwmFromProject', () => {
  it('defaults from the control rate and the inverter: carrier = control rate, one update, the inverter\'s modulation and drop, the bus (issue 14 of this project)', () => {
    const p = traction();
    const control = p.file.control!;
    expect(pwmFromProject(p, control)).toEqual({
      model: 'average', fsw_Hz: 10000, updatesPerPeriod: 1, deadTime_s: 0, modulation: 'svpwm', Vdc: 350, deviceDrop_V: 1, zeroCurrent_A: ZERO_CURRENT_FRACTION * p.peak.Imax,
    });
    const two = pwmFromProject(p, { ...control, pwm: { model: 'switching', fsw_Hz: 5000, deadTime_s: 1e-6, modulation: 'dpwm1', deviceDrop: 0 } });
    expect([two.model, two.fsw_Hz, two.updatesPerPeriod, two.deadTime_s, two.modulation, two.deviceDrop_V]).toEqual(['switching', 5000, 2, 1e-6, 'dpwm1', 0]);
  });
  it('the zoom window from control.pwm.window_s (absent: no window, the default of the last two fundamental periods)', () => {
    const p = traction();
    const control = p.file.control!;
    expect(pwmFromProject(p, { ...control, pwm: { model: 'switching', deadTime_s: 0, window_s: { from: 0.5, to: 0.51 } } }).window).toEqual({ from_s: 0.5, to_s: 0.51 });
    expect(pwmFromProject(p, { ...control, pwm: { model: 'switching', deadTime_s: 0 } })).not.toHaveProperty('window');
  });
  it('dead-time compensation: absent or false gives no compensation (the spec as before); true gives its band, a fraction of the peak current limit (common practice, no source)', () => {
    const p = traction();
    const control = p.file.control!;
    expect(pwmFromProject(p, { ...control, pwm: { model: 'switching', deadTime_s: 1e-6 } })).not.toHaveProperty('compensation');
    expect(pwmFromProject(p, { ...control, pwm: { model: 'switching', deadTime_s: 1e-6, deadTimeCompensation: false } })).not.toHaveProperty('compensation');
    expect(pwmFromProject(p, { ...control, pwm: { model: 'switching', deadTime_s: 1e-6, deadTimeCompensation: true } }).compensation).toEqual({ band_A: COMPENSATION_BAND_FRACTION * p.peak.Imax });
  });
  it('modulation from inverter.modulation: "sinusoidal" stays, "six-step" gives min-max "svpwm"', () => {
    for (const [inv, pwm] of [['sinusoidal', 'sinusoidal'], ['six-step', 'svpwm']] as const) {
      const j = demoJson('demo-ipm-traction');
      j.inverter.modulation = inv;
      const p = resolveProject(parseProject(j));
      expect(pwmFromProject(p, defaultControl()).modulation).toBe(pwm);
    }
  });
  it('a control section changed after parsing is checked as the schema does, naming the field', () => {
    const p = traction();
    expect(messageOf(() => pwmFromProject(p, { ...p.file.control!, pwm: { model: 'switching', deadTime_s: 0, fsw_Hz: 7000 } }))).toMatch(/^control\.pwm\.fsw_Hz must be control\.fCtrl_Hz/);
  });
  it('the simulation setup carries it', () => {
    const s = simulationFromProject(traction(), { control: { pwm: { model: 'switching', deadTime_s: 2e-6 } } });
    expect(s.pwm?.model).toBe('switching');
    expect(s.pwm?.deadTime_s).toBe(2e-6);
  });
});

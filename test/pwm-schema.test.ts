// The project's `control.pwm` section (src/core/project/pwm-schema.ts): shape, defaults and the
// refusals naming the field. Key names: issue 14 of this project; bounds and messages: common
// practice (no source).
import { describe, expect, it } from 'vitest';
import { messageOf } from './helpers';
import { checkProject, KEYS, parseProject } from '../src/core/project/schema';
import { pwmSchema } from '../src/core/project/pwm-schema';

const minimal = (pwm?: unknown, fCtrl_Hz = 10000): Record<string, unknown> => ({
  format: 'torquewise-project', version: 1, name: 'test (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
  control: pwm === undefined ? { fCtrl_Hz } : { fCtrl_Hz, pwm },
});

describe('control.pwm', () => {
  it('absent: no pwm key (the averaged inverter); an empty section takes the defaults: model "average", dead time 0, the rest resolved later', () => {
    expect(parseProject(minimal()).control?.pwm).toBeUndefined();
    expect(parseProject(minimal({})).control?.pwm).toEqual({ model: 'average', deadTime_s: 0 });
    expect(pwmSchema.parse({ model: 'switching', fsw_Hz: 5000, deadTime_s: 1e-6, modulation: 'dpwm1', deviceDrop: 1.2 }))
      .toEqual({ model: 'switching', fsw_Hz: 5000, deadTime_s: 1e-6, modulation: 'dpwm1', deviceDrop: 1.2 });
  });
  it('every key is documented', () => {
    for (const k of ['control.pwm', 'control.pwm.model', 'control.pwm.fsw_Hz', 'control.pwm.deadTime_s', 'control.pwm.modulation', 'control.pwm.deviceDrop']) expect(KEYS[k]?.doc.length).toBeGreaterThan(10);
  });
  it('refusals name the field and what is allowed', () => {
    expect(messageOf(() => parseProject(minimal({ model: 'exact' })))).toMatch(/^control\.pwm\.model .*average.*switching/);
    expect(messageOf(() => parseProject(minimal({ modulation: 'six-step' })))).toMatch(/^control\.pwm\.modulation .*sinusoidal.*svpwm.*dpwm1/);
    expect(messageOf(() => parseProject(minimal({ deadTime_s: -1e-6 })))).toMatch(/^control\.pwm\.deadTime_s must be >= 0/);
    expect(messageOf(() => parseProject(minimal({ fsw_Hz: 3000 })))).toBe('control.pwm.fsw_Hz must be control.fCtrl_Hz (10000 Hz, one control update per carrier period) or half of it (5000 Hz, two updates)');
    expect(messageOf(() => parseProject(minimal({ deadTime_s: 3e-5 })))).toMatch(/^control\.pwm\.deadTime_s must be below a quarter of the carrier period \(25\.0 µs at 10000 Hz\)/);
    expect(messageOf(() => parseProject(minimal({ deviceDrop: 30 })))).toBe('control.pwm.deviceDrop must be < half of inverter.Vdc (24 V)');
    expect(messageOf(() => parseProject(minimal({ dead_time: 1 })))).toMatch(/control\.pwm/);
    expect(checkProject(minimal({ fsw_Hz: 5000, model: 'switching' }))).toEqual([]);
  });
  it('deadTimeCompensation: a boolean, off when absent (results unchanged), documented, refused otherwise naming the field', () => {
    expect(parseProject(minimal({ model: 'switching', deadTimeCompensation: true })).control?.pwm?.deadTimeCompensation).toBe(true);
    expect(parseProject(minimal({ model: 'switching' })).control?.pwm?.deadTimeCompensation).toBeUndefined();
    expect(KEYS['control.pwm.deadTimeCompensation']?.doc).toMatch(/default false/);
    expect(messageOf(() => parseProject(minimal({ deadTimeCompensation: 'yes' })))).toMatch(/^control\.pwm\.deadTimeCompensation /);
  });
  it('window_s {from, to}: optional, the end after the start, every key documented', () => {
    expect(parseProject(minimal({ model: 'switching', window_s: { from: 0.1, to: 0.12 } })).control?.pwm?.window_s).toEqual({ from: 0.1, to: 0.12 });
    expect(messageOf(() => parseProject(minimal({ window_s: { from: 0.2, to: 0.1 } })))).toBe('control.pwm.window_s.to must be > control.pwm.window_s.from (0.2 s)');
    expect(messageOf(() => parseProject(minimal({ window_s: { from: -1, to: 0.1 } })))).toMatch(/^control\.pwm\.window_s\.from must be >= 0/);
    expect(messageOf(() => parseProject(minimal({ window_s: { from: 0, to: 0.1, step: 1 } })))).toMatch(/control\.pwm\.window_s/);
    for (const k of ['control.pwm.window_s', 'control.pwm.window_s.from', 'control.pwm.window_s.to']) expect(KEYS[k]?.doc.length).toBeGreaterThan(10);
  });
});

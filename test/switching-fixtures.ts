// A project with the switching model on (not a test file itself): the 48 V SPM demo (which stays
// averaged) with control.pwm "switching" at a 10 kHz carrier (two control updates per period), a
// 1 µs dead time, a shorter scenario.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { demoJson } from './helpers';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function switchingProjectJson(window_s?: { from: number; to: number }): Record<string, any> {
  const d = demoJson('demo-spm-48v');
  d.name = 'SPM 48 V demo, switching model (test fixture)';
  d.control.pwm = { model: 'switching', fsw_Hz: 10000, deadTime_s: 1e-6, ...(window_s ? { window_s } : {}) };
  d.control.angle = { source: 'ideal' }; // the demo's sensorless start-up is not what these tests check
  pinSpmSpeedTuning(d);
  d.scenario.duration_s = 0.16;
  d.scenario.loadSteps = [{ t_s: 0.12, torque_Nm: 3 }];
  return d;
}

/** The fixture written to a new temporary folder: its path. */
export function switchingProjectFile(window_s?: { from: number; to: number }): string {
  const dir = mkdtempSync(join(tmpdir(), 'tw-switching-'));
  const path = join(dir, 'switching.json');
  writeFileSync(path, JSON.stringify(switchingProjectJson(window_s), null, 2));
  return path;
}

/**
 * The 48 V demo's speed loop as these switching tests were written for (symmetric optimum, a = 2,
 * about 400 Hz; the demo itself now tunes it to 60 Hz for its sensorless estimator) and no dead-time
 * compensation: a copy of the demo pinned for tests that check the PWM model.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function pinSpmSpeedTuning(d: Record<string, any>): void {
  d.control.speedTuning = { method: 'symmetric-optimum', a: 2 };
  delete d.control.speedBandwidth_Hz;
  if (d.control.pwm) delete d.control.pwm.deadTimeCompensation;
}

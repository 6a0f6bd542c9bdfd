// The project's `control.angle` section (src/core/project/angle-schema.ts): shape, defaults and the
// refusals naming the field. Key names and defaults: issue 15 of this project; bounds and messages:
// common practice (no source).
import { describe, expect, it } from 'vitest';
import { messageOf } from './helpers';
import { checkProject, KEYS, parseProject } from '../src/core/project/schema';
import { angleSchema, ANGLE_OPTIONS } from '../src/core/project/angle-schema';

const minimal = (angle?: unknown): Record<string, unknown> => ({
  format: 'torquewise-project', version: 1, name: 'test (invented)',
  motor: { polePairs: 4, Rs: 0.05, Ld: 1e-4, Lq: 1.2e-4, psiM: 0.01, inertia: 1e-4 },
  inverter: { Vdc: 48, Imax: 100, Icont: 50, modulation: 'svpwm' },
  control: angle === undefined ? { fCtrl_Hz: 10000 } : { fCtrl_Hz: 10000, angle },
});

describe('control.angle', () => {
  it('absent: no angle key (ideal); each source takes its defaults', () => {
    expect(parseProject(minimal()).control?.angle).toBeUndefined();
    expect(parseProject(minimal({ source: 'ideal' })).control?.angle).toEqual({ source: 'ideal' });
    expect(parseProject(minimal({ source: 'encoder' })).control?.angle).toEqual({ source: 'encoder', linesPerRev: 2048, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0 });
    expect(parseProject(minimal({ source: 'resolver' })).control?.angle).toEqual({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0, quadratureError_deg: 0, polePairs: 1 });
    expect(parseProject(minimal({ source: 'sensorless', handoverSpeed_rpm: 300 })).control?.angle).toEqual({ source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 300, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 });
  });
  it('the issue\'s examples parse as written', () => {
    expect(angleSchema.parse({ source: 'encoder', linesPerRev: 2048, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0, timerFrequency_Hz: 1e8 }))
      .toEqual({ source: 'encoder', linesPerRev: 2048, speedWindowPeriods: 4, speedFilter_Hz: 0, offset_deg: 0, timerFrequency_Hz: 1e8 });
    expect(angleSchema.parse({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0.01, quadratureError_deg: 0.5 }))
      .toEqual({ source: 'resolver', bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0.01, quadratureError_deg: 0.5, polePairs: 1 });
    expect(checkProject(minimal({ source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 200, fluxError_pct: 20, resistanceError_pct: 0, inductanceError_pct: 0 }))).toEqual([]);
  });
  it('every key is documented', () => {
    const keys = new Set(Object.values(ANGLE_OPTIONS).flat());
    for (const k of ['control.angle', 'control.angle.source', ...[...keys].map((x) => `control.angle.${x}`)]) expect(KEYS[k]?.doc.length, k).toBeGreaterThan(10);
  });
  it('refusals name the field and what is allowed', () => {
    expect(messageOf(() => parseProject(minimal({ source: 'hall' })))).toMatch(/^control\.angle\.source .*ideal.*encoder.*resolver.*sensorless/);
    expect(messageOf(() => parseProject(minimal({})))).toMatch(/^control\.angle\.source/);
    expect(messageOf(() => parseProject(minimal({ source: 'encoder', linesPerRev: 0 })))).toMatch(/^control\.angle\.linesPerRev must be >= 1/);
    expect(messageOf(() => parseProject(minimal({ source: 'encoder', linesPerRev: 100.5 })))).toMatch(/^control\.angle\.linesPerRev .*whole number/);
    expect(messageOf(() => parseProject(minimal({ source: 'resolver', bandwidth_Hz: 0 })))).toMatch(/^control\.angle\.bandwidth_Hz must be > 0/);
    expect(messageOf(() => parseProject(minimal({ source: 'encoder', bandwidth_Hz: 300 }))))
      .toBe('control.angle.bandwidth_Hz is not an option of source "encoder" (its options: linesPerRev, speedWindowPeriods, speedFilter_Hz, offset_deg, timerFrequency_Hz)');
    expect(messageOf(() => parseProject(minimal({ source: 'ideal', linesPerRev: 10 })))).toBe('control.angle.linesPerRev is not an option of source "ideal" (it takes no options)');
    expect(messageOf(() => parseProject(minimal({ source: 'sensorless' })))).toMatch(/^control\.angle\.handoverSpeed_rpm is required by source "sensorless"/);
    expect(messageOf(() => parseProject(minimal({ source: 'encoder', lines: 10 })))).toMatch(/control\.angle/);
  });
});

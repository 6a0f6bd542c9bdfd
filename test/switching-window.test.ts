// Where the switching model's zoom window sits (src/core/project/switching-window.ts): control.pwm.window_s
// as given, windowAt "load-step" around the first load event, "end" or neither key the engine's default
// (the run's last two fundamental periods, results unchanged); bad values refused naming their key, by
// the schema, by the project's PWM specification and by the engine's capture; the CLI's --json window.
import { describe, expect, it } from 'vitest';
import { demoJson, messageOf, refusal } from './helpers';
import { parseProject } from '../src/core/project/schema';
import { loadProjectText, resolveProject } from '../src/core/project/project';
import { pwmFromProject } from '../src/core/project/pwm-from-project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { runSimulation } from '../src/core/simulation/simulate';
import { SwitchingCapture } from '../src/core/simulation/switching-capture';
import { firstLoadEvent, MAX_WINDOW_PERIODS, MIN_WINDOW_PERIODS, speedAskedAt, switchingWindow } from '../src/core/project/switching-window';
import { KEYS } from '../src/core/project/schema-keys';

// the servo demo with the switching model: 2000 rpm asked from 5 ms, 2 N·m from 50 ms, 0.1 s, 4 pole pairs, 16 kHz
// eslint-disable-next-line @typescript-eslint/no-explicit-any
const servo = (pwm: Record<string, unknown>): Record<string, any> => {
  const j = demoJson('demo-servo-axis');
  j.control.angle = { source: 'ideal' };
  j.control.pwm = { model: 'switching', ...pwm };
  return j;
};

describe('the window at the load step', () => {
  it('two fundamental periods at the speed asked there, a quarter of it before the first load event', () => {
    // 2000 rpm with 4 pole pairs: 133.3 Hz electrical, two periods 15 ms (common practice (no source))
    const j = servo({ windowAt: 'load-step' });
    const p = resolveProject(parseProject(j));
    const w = pwmFromProject(p, p.file.control!).window!;
    expect(w.to_s - w.from_s).toBeCloseTo(0.015, 12);
    expect(w.from_s).toBeCloseTo(0.05 - 0.015 / 4, 12);
    expect(firstLoadEvent(p.file.scenario!)).toBe(0.05);
    expect(speedAskedAt(p.file.scenario!, 0.05)).toBe(2000);
    expect(speedAskedAt(p.file.scenario!, 0.001)).toBe(0);
  });

  it('a load ramp counts as a load event; at standstill the least window, at a crawl the most; cut at the run\'s end', () => {
    const sc = { duration_s: 1, initialSpeed_rpm: 0, speedSteps: [], loadSteps: [{ t_s: 0.5, torque_Nm: 1 }], loadRamps: [{ t_s: 0.2, duration_s: 0.1, torque_Nm: 1 }] };
    expect(firstLoadEvent(sc)).toBe(0.2);
    const pwm = { model: 'switching' as const, deadTime_s: 0, windowAt: 'load-step' as const };
    const w0 = switchingWindow(pwm, sc, 10000, 4)!;
    expect(w0.to_s - w0.from_s).toBeCloseTo(MIN_WINDOW_PERIODS / 10000, 12);
    const crawl = switchingWindow(pwm, { ...sc, initialSpeed_rpm: 1 }, 10000, 4)!;
    expect(crawl.to_s - crawl.from_s).toBeCloseTo(MAX_WINDOW_PERIODS / 10000, 12);
    const late = switchingWindow(pwm, { ...sc, loadRamps: [], loadSteps: [{ t_s: 0.999, torque_Nm: 1 }], initialSpeed_rpm: 3000 }, 10000, 4)!;
    expect(late.to_s).toBe(1);
    expect(switchingWindow({ ...pwm, windowAt: 'end' }, sc, 10000, 4)).toBeNull();
    expect(switchingWindow({ model: 'switching', deadTime_s: 0 }, sc, 10000, 4)).toBeNull();
  });

  it('the run\'s window holds the load step at full resolution, over the span placed', () => {
    const r = runSimulation(simulationFromProject(loadProjectText(JSON.stringify(servo({ windowAt: 'load-step' })))));
    const w = r.switching!.window;
    expect(w.from_s).toBeCloseTo(0.04625, 12);
    expect(w.to_s).toBeCloseTo(0.06125, 12);
    expect(w.truncated).toBe(false);
    expect(w.t_s[0]).toBeGreaterThanOrEqual(w.from_s);
    expect(w.t_s[w.t_s.length - 1]).toBeLessThanOrEqual(w.to_s);
    // several boundaries per 62.5 µs carrier period over the 15 ms: more than 240 periods x 4
    expect(w.t_s.length).toBeGreaterThan(240 * 4);
    expect(w.t_s.some((t) => t > 0.0499 && t < 0.0501)).toBe(true);
  });

  it('"end" and no key give the same run (the default window, results unchanged)', () => {
    const a = runSimulation(simulationFromProject(loadProjectText(JSON.stringify(servo({})))));
    const b = runSimulation(simulationFromProject(loadProjectText(JSON.stringify(servo({ windowAt: 'end' })))));
    expect(b.switching!.window.from_s).toBe(a.switching!.window.from_s);
    expect(Array.from(b.switching!.window.ia_A)).toEqual(Array.from(a.switching!.window.ia_A));
    expect(b.metrics).toEqual(a.metrics);
  });
});

describe('bad values, named by their key', () => {
  it('the schema: a window that starts after the run, windowAt with window_s, "load-step" without a load event, an unknown anchor', () => {
    expect(messageOf(() => parseProject(servo({ window_s: { from: 0.2, to: 0.3 } })))).toBe('control.pwm.window_s.from must be < scenario.duration_s (0.1 s): the window starts after the run ends');
    expect(messageOf(() => parseProject(servo({ windowAt: 'load-step', window_s: { from: 0.01, to: 0.02 } })))).toMatch(/^control\.pwm\.windowAt cannot be given with control\.pwm\.window_s/);
    const none = servo({ windowAt: 'load-step' });
    none.scenario.loadSteps = [];
    expect(messageOf(() => parseProject(none))).toMatch(/^control\.pwm\.windowAt is "load-step" but the scenario has no load step or load ramp/);
    expect(messageOf(() => parseProject(servo({ windowAt: 'middle' })))).toMatch(/^control\.pwm\.windowAt .*end.*load-step/);
    expect(KEYS['control.pwm.windowAt']?.doc).toMatch(/load-step/);
  });

  it('a duration shortened after parsing (an override): refused by the PWM specification and by the capture', () => {
    const p = loadProjectText(JSON.stringify(servo({ window_s: { from: 0.08, to: 0.09 } })));
    expect(refusal(() => simulationFromProject(p, { scenario: { duration_s: 0.05 } })).field).toBe('control.pwm.window_s.from');
    const e = refusal(() => new SwitchingCapture(0.05 * 16000, { from_s: 0.08, to_s: 0.09 }, 16000));
    expect(e.message).toBe('control.pwm.window_s.from must be < the run\'s duration (0.05 s): the zoom window starts after the run ends');
  });

  it('a window running past the end is sized for the part the run reaches', () => {
    // 0.5 to 1 s of a 1 s run at 1 kHz: 500 carrier periods, 14 boundaries each at most
    expect(new SwitchingCapture(1000, { from_s: 0.5, to_s: 50 }, 1000).window.cap).toBe(14 * 500 + 16);
  });
});

import { describe, expect, it } from 'vitest';
import { RunLog, MAX_INTERVALS } from '../src/core/simulation/run-log';
import { periodSample } from '../src/core/simulation/period-sample';

// common practice (no source): intervals of a flag merged across gaps shorter than `gap` periods
describe('run log', () => {
  const Ts = 1e-3;
  it('an interval opens at the first flagged period and closes gap-1 periods after the last', () => {
    const log = new RunLog(Ts, 3, 100);
    const flags = [0, 1, 1, 0, 1, 0, 0, 0, 0, 0];
    flags.forEach((f, k) => log.observe(periodSample(k * Ts, 1, 0, 0, 1), f === 1, false));
    const ev = log.finish(10 * Ts);
    expect(ev).toHaveLength(1);
    expect(ev[0]!.kind).toBe('current-limit');
    expect(ev[0]!.t_s).toBeCloseTo(1e-3, 15);
    expect(ev[0]!.tEnd_s).toBeCloseTo(5e-3, 15); // last flagged at 4 ms, closed at 7 ms - 2 periods
  });
  it('rms input, saturation time and the peak with its reference and time since saturation', () => {
    const log = new RunLog(Ts, 1, 100);
    log.observe(periodSample(0, 2, 0, 0, 3), false, true);
    log.observe(periodSample(1e-3, 0, 4, 0, 3, 4), false, false);
    log.observe(periodSample(2e-3, 3, 0, 0, 1), false, false);
    expect(log.sumI2).toBe(29);
    expect(log.satPeriods).toBe(1);
    expect(log.peakDetail()).toEqual({ t_s: 1e-3, reference_A: 5, sinceVoltageLimit_s: 1e-3 });
  });
  it('overspeed intervals, closed at the end of the run if still open', () => {
    const log = new RunLog(Ts, 1, 100);
    log.observe(periodSample(0, 0, 0, 150), false, false);
    log.observe(periodSample(1e-3, 0, 0, 50), false, false);
    log.observe(periodSample(2e-3, 0, 0, -150), false, false);
    const ev = log.finish(3e-3);
    expect(ev.map((e) => [e.kind, e.t_s, e.tEnd_s])).toEqual([['overspeed', 0, 1e-3], ['overspeed', 2e-3, 3e-3]]);
    expect(ev[0]!.message).toBe('speed above 954.9 rpm');
  });
  it(`lists at most ${MAX_INTERVALS} intervals per kind, then says so`, () => {
    const log = new RunLog(Ts, 1, 100);
    for (let k = 0; k < 600; k++) log.observe(periodSample(k * Ts, 0, 0, 0), false, k % 2 === 0);
    const ev = log.finish(0.6);
    expect(ev).toHaveLength(MAX_INTERVALS + 1);
    expect(ev[MAX_INTERVALS]!.message).toBe('more than 200 intervals; the rest are not listed');
  });
});

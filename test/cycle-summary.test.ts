import { describe, expect, it } from 'vitest';
import { type CycleArrays } from '../src/core/simulation/cycle-pass';
import { summarizeCycle, verdictOf } from '../src/core/simulation/cycle-summary';
import { THERMAL } from './duty-cycle-fixtures';

/** arrays of N instants over t = 0..N-1 s */
function arrays(N: number): CycleArrays {
  const f = () => new Float64Array(N);
  return {
    winding_C: f(), stator_C: f(), copper_W: f(), iron_W: f(), mechanical_W: f(), inverter_W: f(), dcPower_W: f(),
    current_A: f(), lossTorque_Nm: f(), outside: new Uint8Array(N), solved: new Uint8Array(N).fill(1),
  };
}

describe('duty cycle summary', () => {
  it('energies and RMS current by the trapezoid rule, exact for powers linear in time (common practice (no source))', () => {
    const N = 11, t = Float64Array.from({ length: N }, (_, k) => k);
    const x = { t_s: t, speed_rpm: new Float64Array(N).fill(3000 / Math.PI), torque_Nm: Float64Array.from(t, (v) => 2 * v) };
    const a = arrays(N);
    for (let k = 0; k < N; k++) {
      a.copper_W[k] = 100 + 10 * k; a.iron_W[k] = 50; a.mechanical_W[k] = 5; a.inverter_W[k] = 20 + k;
      a.current_A[k] = 100; a.winding_C[k] = 60 + k; a.stator_C[k] = 50 + 0.1 * k;
      a.dcPower_W[k] = 2 * k * 100 + a.copper_W[k]! + 50 + 5 + a.inverter_W[k]!;
    }
    const s = summarizeCycle(x, a, THERMAL, new Float64Array([60, 50]), 1000);
    // shaft power 2 t * 100 rad/s: 100 t^2 over 10 s = 10000 J
    expect(s.energies.shaft_J).toBeCloseTo(10000, 9);
    expect(s.energies.copper_J).toBeCloseTo(1000 + 500, 9);
    expect(s.energies.inverter_J).toBeCloseTo(200 + 50, 9);
    expect(s.energies.balanceResidual).toBeCloseTo(0, 14);
    expect(s.energies.heatStored_J).toBeCloseTo(900 * 10 + 9000 * 1, 9);
    expect(s.energies.heatResidual).toBeCloseTo((18000 - (1500 + 500 - 1000)) / 2000, 12);
    expect(s.rmsCurrent_A).toBeCloseTo(100, 12);
    expect(s.peaks.winding).toEqual({ value: 70, t_s: 10 });
    expect(s.magnet_C[10]).toBeCloseTo(51 + 10, 12);
    // junction: T_c + R_jc P_inv / 6
    expect(s.junction_C[4]).toBeCloseTo(40 + 0.15 * 24 / 6, 12);
    expect(s.verdict).toEqual({ status: 'within-limits', text: 'within limits' });
  });

  it('intervals outside the envelope, limits exceeded, and the verdict naming them', () => {
    const N = 10, t = Float64Array.from({ length: N }, (_, k) => 0.5 * k);
    const x = { t_s: t, speed_rpm: new Float64Array(N), torque_Nm: new Float64Array(N) };
    const a = arrays(N);
    a.winding_C.fill(100); a.stator_C.fill(60);
    a.outside.set([0, 1, 1, 0, 0, 4, 0, 0, 0, 0]);
    a.current_A.set([10, 500, 520, 10, 10, 90, 10, 10, 10, 10]);
    let s = summarizeCycle(x, a, THERMAL, new Float64Array([100, 60]), 0);
    expect(s.outside).toEqual([
      { from_s: 0.5, to_s: 1, limitedBy: 'current', peakCurrent_A: 520 },
      { from_s: 2.5, to_s: 2.5, limitedBy: 'beyond-mtpv', peakCurrent_A: 90 },
    ]);
    expect(s.verdict.status).toBe('outside-envelope');
    a.outside.fill(0);
    a.winding_C.set([150, 154, 156, 160, 158, 150, 150, 150, 150, 150]);
    s = summarizeCycle(x, a, THERMAL, new Float64Array([150, 60]), 0);
    expect(s.exceeded).toEqual([{ limit: 'winding', max_C: 155, first_s: 1, peak: { value: 160, t_s: 1.5 } }]);
    expect(s.verdict).toEqual({ status: 'limit-exceeded', text: 'winding above its 155.0 °C limit from 1.00 s (peak 160.0 °C at 1.50 s)' });
    // an unrated junction is never exceeded
    a.inverter_W.fill(1e5);
    expect(summarizeCycle(x, a, { ...THERMAL, junctionToCoolant_K_per_W: undefined }, new Float64Array([150, 60]), 0).exceeded.map((e) => e.limit)).toEqual(['winding']);
    expect(summarizeCycle(x, a, THERMAL, new Float64Array([150, 60]), 0).exceeded.map((e) => e.limit)).toEqual(['winding', 'junction']);
  });

  it('both at once: outside the envelope first', () => {
    const v = verdictOf([{ from_s: 1, to_s: 2, limitedBy: 'voltage', peakCurrent_A: 1 }], [{ limit: 'magnet', max_C: 140, first_s: 3, peak: { value: 141, t_s: 4 } }]);
    expect(v.status).toBe('outside-envelope');
    expect(v.text).toBe('outside the envelope in 1 interval, first 1.00..2.00 s (voltage limit); magnet above its 140.0 °C limit from 3.00 s (peak 141.0 °C at 4.00 s)');
  });
});

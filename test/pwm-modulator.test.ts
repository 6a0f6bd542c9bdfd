// The carrier modulator (src/core/drive/pwm-modulator.ts): duties by modulation, clipping, edges.
import { describe, expect, it } from 'vitest';
import { fallingEdge, legDuties, legsToAlphaBeta, phaseDuties, risingEdge, switchingStateTable } from '../src/core/drive/pwm-modulator';
import { hexagonRadius } from '../src/core/drive/inverter';

const Vdc = 400;
const d = new Float64Array(3);
const ab = new Float64Array(2);

/** the mean phase voltage (alpha, beta) the duties make: each leg d Vdc, common mode removed */
function produced(out: Float64Array): void {
  legsToAlphaBeta(d[0]! * Vdc, d[1]! * Vdc, d[2]! * Vdc, out);
}

describe('carrier modulator', () => {
  it('in the linear range every modulation makes the reference on average: sinusoidal to Vdc/2, min-max and DPWM1 to Vdc/sqrt 3 (Holmes and Lipo 2003, Pulse Width Modulation for Power Converters, ch. 6)', () => {
    for (const [mod, r] of [['sinusoidal', 0.5], ['svpwm', 1 / Math.sqrt(3)], ['dpwm1', 1 / Math.sqrt(3)]] as const) {
      for (let k = 0; k < 72; k++) {
        const th = (2 * Math.PI * k) / 72 + 0.01;
        const V = 0.999 * r * Vdc;
        legDuties(V * Math.cos(th), V * Math.sin(th), Vdc, mod, d);
        for (const x of d) { expect(x).toBeGreaterThanOrEqual(0); expect(x).toBeLessThanOrEqual(1); }
        produced(ab);
        expect(ab[0]).toBeCloseTo(V * Math.cos(th), 9);
        expect(ab[1]).toBeCloseTo(V * Math.sin(th), 9);
      }
    }
  });

  it('sinusoidal is d = 1/2 + v/Vdc; min-max centres the duties (max + min = 1) (Holmes and Lipo 2003, ch. 6)', () => {
    phaseDuties(100, -30, -70, Vdc, 'sinusoidal', d);
    expect(d[0]).toBeCloseTo(0.75, 14);
    expect(d[1]).toBeCloseTo(0.425, 14);
    expect(d[2]).toBeCloseTo(0.325, 14);
    phaseDuties(100, -30, -70, Vdc, 'svpwm', d);
    expect(d[0]! + d[2]!).toBeCloseTo(1, 12);
    expect(d[0]! - d[1]!).toBeCloseTo(130 / Vdc, 12);
  });

  it('DPWM1 clamps the leg of the largest |v| to its rail, each leg for 120° of every 360° in two 60° spans about its peaks (Hava, Kerkman and Lipo 1998, IEEE Trans. Power Electronics 14(1))', () => {
    let clampedA = 0, high = 0;
    const N = 3600;
    for (let k = 0; k < N; k++) {
      const th = (2 * Math.PI * (k + 0.5)) / N;
      legDuties(150 * Math.cos(th), 150 * Math.sin(th), Vdc, 'dpwm1', d);
      expect(d.filter((x) => x === 0 || x === 1).length).toBeGreaterThanOrEqual(1);
      if (d[0] === 0 || d[0] === 1) clampedA++;
      if (d[0] === 1) high++;
    }
    expect(clampedA / N).toBeCloseTo(1 / 3, 3);
    expect(high / N).toBeCloseTo(1 / 6, 3);
  });

  it('overmodulation clips the duties to 0 and 1 and the vector stays inside the hexagon, short of the reference (common practice, no source)', () => {
    for (const mod of ['sinusoidal', 'svpwm', 'dpwm1'] as const) {
      for (let k = 0; k < 36; k++) {
        const th = (2 * Math.PI * k) / 36 + 0.05;
        const V = 0.75 * Vdc;
        legDuties(V * Math.cos(th), V * Math.sin(th), Vdc, mod, d);
        if (mod === 'sinusoidal') expect(d.some((x) => x === 0 || x === 1)).toBe(true); // the legs past Vdc/2 saturate
        else { expect(Math.max(...d)).toBe(1); expect(Math.min(...d)).toBe(0); } // past the hexagon both outer legs do
        produced(ab);
        const len = Math.hypot(ab[0]!, ab[1]!);
        expect(len).toBeLessThanOrEqual(hexagonRadius(Vdc, Math.atan2(ab[1]!, ab[0]!)) * (1 + 1e-12));
        expect(len).toBeLessThan(V);
      }
    }
  });

  it('centred pulses: on over [(1 - d) Tc/2, (1 + d) Tc/2] (a symmetric carrier, common practice, no source)', () => {
    expect(risingEdge(0.3, 1e-4)).toBeCloseTo(0.35e-4, 15);
    expect(fallingEdge(0.3, 1e-4)).toBeCloseTo(0.65e-4, 15);
    expect(fallingEdge(0.3, 1e-4) - risingEdge(0.3, 1e-4)).toBeCloseTo(0.3e-4, 15);
  });
  it('the eight switching states: two zero vectors and six active ones of length 2 Vdc/3, 60 deg apart, state 1 (a on) along alpha (Holmes and Lipo 2003, Pulse Width Modulation for Power Converters, ch. 6)', () => {
    // the states without the device drop: the table's entries for state st (any sign pattern), alpha and beta
    const t = new Float64Array(320);
    switchingStateTable(Vdc, 0, t);
    const v = new Float64Array(16);
    for (let st = 0; st < 8; st++) { v[2 * st] = t[5 * st]!; v[2 * st + 1] = t[5 * st + 1]!; }
    expect(Math.hypot(v[0]!, v[1]!)).toBe(0);
    expect(Math.hypot(v[14]!, v[15]!)).toBeCloseTo(0, 12);
    expect(v[2]!).toBeCloseTo((2 * Vdc) / 3, 12);
    expect(v[3]!).toBeCloseTo(0, 12);
    // the hexagon's corners in order a, ab, b, bc, c, ca: states 1, 3, 2, 6, 4, 5
    const order = [1, 3, 2, 6, 4, 5];
    order.forEach((st, k) => {
      expect(Math.hypot(v[2 * st]!, v[2 * st + 1]!)).toBeCloseTo((2 * Vdc) / 3, 9);
      expect(Math.atan2(v[2 * st + 1]!, v[2 * st]!)).toBeCloseTo(Math.atan2(Math.sin((k * Math.PI) / 3), Math.cos((k * Math.PI) / 3)), 12);
    });
    // each state as legsToAlphaBeta reads the leg voltages
    for (let st = 0; st < 8; st++) {
      legsToAlphaBeta((st & 1) * Vdc, ((st >> 1) & 1) * Vdc, ((st >> 2) & 1) * Vdc, ab);
      expect(v[2 * st]!).toBeCloseTo(ab[0]!, 12);
      expect(v[2 * st + 1]!).toBeCloseTo(ab[1]!, 12);
    }
  });
  it('the states with the device drop: each leg at its rail minus drop sgn(i); without the drop the states themselves (common practice, no source)', () => {
    const drop = 1.5;
    const t = new Float64Array(320);
    switchingStateTable(Vdc, drop, t);
    for (let k = 0; k < 64; k++) {
      const sgn = (bit: number): number => ((k & bit) !== 0 ? 1 : -1);
      const ua = (k & 1) * Vdc - drop * sgn(8), ub = ((k >> 1) & 1) * Vdc - drop * sgn(16), uc = ((k >> 2) & 1) * Vdc - drop * sgn(32);
      expect([t[5 * k + 2], t[5 * k + 3], t[5 * k + 4]]).toEqual([ua, ub, uc]);
      legsToAlphaBeta(ua, ub, uc, ab);
      expect(t[5 * k]!).toBeCloseTo(ab[0]!, 12);
      expect(t[5 * k + 1]!).toBeCloseTo(ab[1]!, 12);
    }
    // state a on, phase a's current out of its leg and b's and c's into theirs: alpha 2 (Vdc - 2 drop)/3
    expect(t[5 * (1 + 8)]!).toBeCloseTo((2 * (Vdc - 2 * drop)) / 3, 12);
    // all three currents of one sign (impossible in a star, a check of the common mode): the drop cancels
    expect(t[5 * (1 + 56)]!).toBeCloseTo((2 * Vdc) / 3, 12);
    // without the drop the sign pattern changes nothing: every entry is its state's
    switchingStateTable(Vdc, 0, t);
    for (let k = 0; k < 64; k++) {
      expect(t[5 * k]).toBe(t[5 * (k & 7)]);
      expect(t[5 * k + 1]).toBe(t[5 * (k & 7) + 1]);
    }
  });
});

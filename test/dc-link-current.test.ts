// DC-link current mean, rms and ripple rms (src/core/simulation/dc-link-current.ts), and the closed
// form for sinusoidal PWM that test/switching-period.test.ts checks the switching model against,
// verified here by quadrature over carrier periods.
import { describe, expect, it } from 'vitest';
import { dcLinkCurrent } from '../src/core/simulation/dc-link-current';

/** Kolar and Round (2006): I_C,rms = I sqrt(2M (sqrt 3/(4 pi) + cos² phi (sqrt 3/pi - 9M/16))), I the rms phase current */
const kolar = (I: number, M: number, phi: number): number => I * Math.sqrt(2 * M * (Math.sqrt(3) / (4 * Math.PI) + Math.cos(phi) ** 2 * (Math.sqrt(3) / Math.PI - (9 * M) / 16)));

describe('DC-link current', () => {
  it('mean, rms and ripple rms from the integrals', () => {
    const r = dcLinkCurrent(3 * 2, 25 * 2, 2); // mean 3, mean square 25
    expect(r.mean_A).toBe(3);
    expect(r.rms_A).toBe(5);
    expect(r.rippleRms_A).toBe(4);
    expect(() => dcLinkCurrent(1, 1, 0)).toThrow(/span/);
  });
  it('the closed form of Kolar and Round (2006), IEE Proc. Electric Power Applications 153(4), agrees within 1e-3 with a quadrature of i_dc = sum s_x i_x over centred sinusoidal-PWM periods with ripple-free currents', () => {
    for (const [M, phi] of [[0.3, 0], [0.8, 0.6], [1, 1.2], [0.6, 2.5]] as const) {
      const N = 20000, Ipk = 10;
      let s1 = 0, s2 = 0;
      for (let k = 0; k < N; k++) {
        const th = (2 * Math.PI * (k + 0.5)) / N;
        const legs = [0, 1, 2].map((x) => ({ d: 0.5 + 0.5 * M * Math.cos(th - (2 * Math.PI * x) / 3), i: Ipk * Math.cos(th - phi - (2 * Math.PI * x) / 3) }));
        legs.sort((a, b) => b.d - a.d);
        const [l1, l2, l3] = legs as [typeof legs[0], typeof legs[0], typeof legs[0]];
        // centred pulses: l1 alone on for d1 - d2, l1 and l2 for d2 - d3, all three (i_dc = 0) for d3
        s1 += (l1.d - l2.d) * l1.i + (l2.d - l3.d) * (l1.i + l2.i);
        s2 += (l1.d - l2.d) * l1.i ** 2 + (l2.d - l3.d) * (l1.i + l2.i) ** 2;
      }
      const r = dcLinkCurrent(s1 / N, s2 / N, 1);
      expect(r.rippleRms_A / kolar(Ipk / Math.SQRT2, M, phi)).toBeCloseTo(1, 3);
      expect(r.mean_A).toBeCloseTo(0.75 * M * Ipk * Math.cos(phi), 3); // the power balance
    }
  });
});

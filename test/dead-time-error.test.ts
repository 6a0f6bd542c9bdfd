// The fundamental of the phase voltage error from the legs' per-period errors (src/core/simulation/dead-time-error.ts).
import { describe, expect, it } from 'vitest';
import { deadTimeVoltageError } from '../src/core/simulation/dead-time-error';

describe('dead-time voltage error', () => {
  it('legs losing -sgn(i) E against balanced currents: the phase error\'s fundamental is (4/pi) E, the common mode removed (Murai, Watanabe and Iwasaki 1987, IEEE Trans. Industry Applications IA-23(5))', () => {
    const n = 1200, E = 2;
    const e = [0, 1, 2].map((x) => Float64Array.from({ length: n }, (_, j) => -E * Math.sign(Math.cos((2 * Math.PI * (j + 0.5)) / n - (2 * Math.PI * x) / 3))));
    const r = deadTimeVoltageError(e[0]!, e[1]!, e[2]!, n, 1);
    expect(r.fundamental_V / ((4 / Math.PI) * E)).toBeCloseTo(1, 4);
    expect(r.a).toBeLessThan(0); // against the current cos(wt)
    // a common-mode error alone reaches no phase
    const cm = Float64Array.from({ length: n }, (_, j) => Math.sin((6 * Math.PI * j) / n) + 1);
    expect(deadTimeVoltageError(cm, cm, cm, n, 1).fundamental_V).toBeCloseTo(0, 12);
  });
});

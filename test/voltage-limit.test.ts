import { describe, expect, it } from 'vitest';
import { limitVoltageDq, voltageLimitAt } from '../src/core/control/voltage-limit';
import { modulationLimit } from '../src/core/drive/inverter';

// Holmes and Lipo (2003), Pulse Width Modulation for Power Converters: the SVPWM inscribed circle
// Vdc/sqrt(3) and the two-level bridge's hexagon with vertices at 2 Vdc/3.
describe('voltage limit of the controller', () => {
  const out = new Float64Array(2);
  const svpwm = modulationLimit({ Vdc: 300, deviceDrop: 0, modulation: 'svpwm' });
  const six = modulationLimit({ Vdc: 300, deviceDrop: 0, modulation: 'six-step' });
  it('circle: d kept, q cut to the rest of the radius (3-4-5 triangle)', () => {
    const r = svpwm.radius; // 173.2 V
    expect(limitVoltageDq(svpwm, 0.6 * r, r, 0, out)).toBe(true);
    expect(out[0]).toBeCloseTo(0.6 * r, 12);
    expect(out[1]).toBeCloseTo(0.8 * r, 12);
  });
  it('hexagon: 2 Vdc/3 = 200 V along a vertex, Vdc/sqrt(3) along an edge middle', () => {
    expect(voltageLimitAt(six, 0)).toBeCloseTo(200, 9);
    expect(voltageLimitAt(six, Math.PI / 6)).toBeCloseTo(300 / Math.sqrt(3), 9);
    expect(voltageLimitAt(svpwm, 1)).toBe(svpwm.radius);
    limitVoltageDq(six, 1000, 0, 0, out);
    expect(out[0]).toBeCloseTo(200, 9);
  });
});

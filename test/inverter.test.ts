import { describe, expect, it } from 'vitest';
import {
  MODULATION_GAIN,
  busForVoltageLimit,
  driveLimits,
  effectiveBus,
  hexagonFraction,
  hexagonRadius,
  hexagonVertex,
  inscribedRadius,
  modulationLimit,
  voltageLimit,
} from '../src/core/drive/inverter';
import type { InverterSpec } from '../src/core/drive/inverter-spec';
import { InputError } from '../src/core/base/errors';

const spec = (over: Partial<InverterSpec> = {}): InverterSpec => ({
  Vdc: 600,
  Imax: 300,
  Icont: 150,
  modulation: 'svpwm',
  voltageUtilization: 1,
  deviceDrop: 0,
  ...over,
});

describe('voltage limit per modulation', () => {
  it('sinusoidal PWM Vdc/2', () => {
    // Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters: sine-triangle linear range
    expect(voltageLimit(spec({ modulation: 'sinusoidal' }))).toBeCloseTo(300, 12);
  });
  it('SVPWM linear Vdc/sqrt(3)', () => {
    // Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters: space vector linear limit
    expect(voltageLimit(spec())).toBeCloseTo(600 / Math.sqrt(3), 12);
    expect(voltageLimit(spec())).toBeCloseTo(346.41016, 4);
  });
  it('six-step fundamental 2 Vdc/pi', () => {
    // Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters: six-step fundamental
    expect(voltageLimit(spec({ modulation: 'six-step' }))).toBeCloseTo(1200 / Math.PI, 12);
  });
  it('order: sinusoidal < svpwm < six-step < hexagon vertex', () => {
    expect(MODULATION_GAIN.sinusoidal).toBeLessThan(MODULATION_GAIN.svpwm);
    expect(MODULATION_GAIN.svpwm).toBeLessThan(MODULATION_GAIN['six-step']);
    expect(MODULATION_GAIN['six-step']).toBeLessThan(2 / 3);
  });
  it('SVPWM is 15.47 % above sinusoidal', () => {
    // 2/sqrt(3) = 1.1547, common practice (no source)
    expect(MODULATION_GAIN.svpwm / MODULATION_GAIN.sinusoidal).toBeCloseTo(1.1547005, 6);
  });
});

describe('utilisation and device drop', () => {
  it('utilisation scales, two device drops come off the bus', () => {
    expect(voltageLimit(spec({ voltageUtilization: 0.9 }))).toBeCloseTo(0.9 * 600 / Math.sqrt(3), 12);
    expect(effectiveBus(spec({ deviceDrop: 1.5 }))).toBe(597);
    expect(voltageLimit(spec({ deviceDrop: 1.5 }))).toBeCloseTo(597 / Math.sqrt(3), 12);
    expect(effectiveBus(spec({ Vdc: 2, deviceDrop: 5 }))).toBe(0);
  });
  it('busForVoltageLimit inverts voltageLimit', () => {
    for (const modulation of ['sinusoidal', 'svpwm', 'six-step'] as const) {
      const s = spec({ modulation, voltageUtilization: 0.93, deviceDrop: 1.2 });
      expect(busForVoltageLimit(voltageLimit(s), s)).toBeCloseTo(600, 10);
    }
  });
});

describe('driveLimits', () => {
  it('peak and continuous current', () => {
    expect(driveLimits(spec())).toEqual({ Vmax: 600 / Math.sqrt(3), Imax: 300 });
    expect(driveLimits(spec(), 'continuous').Imax).toBe(150);
  });
  it('rejects a utilisation outside (0, 1]', () => {
    expect(() => driveLimits(spec({ voltageUtilization: 0 }))).toThrow(InputError);
    expect(() => driveLimits(spec({ voltageUtilization: 1.1 }))).toThrow('inverter.voltageUtilization must be in (0, 1]');
    expect(() => driveLimits(spec({ voltageUtilization: NaN }))).toThrow(InputError);
  });
});

describe('hexagon', () => {
  it('vertex 2Vdc/3 at 0 and 60 degrees, inscribed circle Vdc/sqrt3 at 30 degrees', () => {
    // geometry of the space-vector hexagon, Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters
    expect(hexagonVertex(600)).toBe(400);
    expect(hexagonRadius(600, 0)).toBeCloseTo(400, 10);
    expect(hexagonRadius(600, Math.PI / 3)).toBeCloseTo(400, 10);
    expect(hexagonRadius(600, Math.PI / 6)).toBeCloseTo(600 / Math.sqrt(3), 10);
    expect(hexagonRadius(600, -Math.PI / 6)).toBeCloseTo(600 / Math.sqrt(3), 10);
    expect(hexagonRadius(600, 7 * Math.PI / 6)).toBeCloseTo(600 / Math.sqrt(3), 10);
  });
  it('the hexagon edge is a straight line: r cos(a - 30°) is constant', () => {
    for (let a = 0; a < Math.PI / 3; a += 0.05) {
      expect(hexagonRadius(600, a) * Math.cos(a - Math.PI / 6)).toBeCloseTo(600 / Math.sqrt(3), 10);
    }
  });
  it('a vector as a fraction of the hexagon in its direction: |v| / hexagonRadius, 1 on the edge all round', () => {
    // the same hexagon (Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters, ch. 6), read by projections
    const h = inscribedRadius(600);
    for (let a = -Math.PI; a < Math.PI; a += 0.07) {
      const r = hexagonRadius(600, a);
      expect(hexagonFraction(r * Math.cos(a), r * Math.sin(a), h)).toBeCloseTo(1, 12);
      expect(hexagonFraction(0.3 * r * Math.cos(a), 0.3 * r * Math.sin(a), h)).toBeCloseTo(0.3, 12);
    }
    expect(hexagonFraction(400, 0, h)).toBeCloseTo(1, 12); // a vertex, 2 Vdc/3
    expect(hexagonFraction(0, h, h)).toBe(1); // a face's middle
    expect(hexagonFraction(Number.NaN, 0, h)).toBeNaN();
  });
});

describe('controller voltage limit per modulation (whole effective bus)', () => {
  // Holmes and Lipo, 2003, Pulse Width Modulation for Power Converters: sine-triangle range Vdc/2,
  // space-vector inscribed circle Vdc/sqrt(3), six-step hexagon with vertices at 2 Vdc/3
  it('sinusoidal: circle of Vdc/2 on the bus after the device drops', () => {
    expect(modulationLimit(spec({ modulation: 'sinusoidal', deviceDrop: 1 }))).toEqual({ shape: 'circle', radius: 299, Vdc: 598 });
  });
  it('SVPWM: the inscribed circle Vdc/sqrt(3)', () => {
    const l = modulationLimit(spec());
    expect(l.shape).toBe('circle');
    expect(l.radius).toBeCloseTo(346.41016, 4);
  });
  it('six-step: the hexagon, inscribed radius Vdc/sqrt(3), 2 Vdc/3 at a vertex', () => {
    const l = modulationLimit(spec({ modulation: 'six-step' }));
    expect(l.shape).toBe('hexagon');
    expect(l.radius).toBe(inscribedRadius(600));
    expect(hexagonRadius(l.Vdc, 0)).toBeCloseTo(400, 10);
  });
});

import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { minLossAtEmTorque } from '../src/core/steady-state/min-loss-em-torque';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { locusIq, type ShaftLocus } from '../src/core/steady-state/min-loss-current';
import { newPointLossScratch, pointLosses, type LossConditions, type LossSpec } from '../src/core/steady-state/point-losses';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));
const rpm = (n: number) => (n * Math.PI) / 30;
// invented loss data
const INV = { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 };
const FULL: LossSpec = { iron: { kh: 100, beta: 2, ke: 0.5 }, windage: { kw: 5e-8 }, inverter: INV };

describe('loss-minimising current at an electromagnetic torque', () => {
  for (const name of ['demo-ipm-traction', 'demo-ipm-saturated']) {
    it(`${name}: same electromagnetic torque, no more loss than the least current, within both limits, and the least loss of a dense scan`, () => {
      const p = demo(name);
      const m = p.models.hot;
      const c: LossConditions = { Vdc: p.inverter.Vdc, friction: { B: 0, Tc: 0 }, losses: FULL };
      const sc = newPointLossScratch();
      let gained = 0;
      for (const [n, T] of [[3000, 90], [6000, -60], [8000, 30], [1500, 150], [0, 120]] as const) {
        const w = rpm(n);
        const p0 = solveOperatingPoint(m, p.peak, w, T);
        const q = minLossAtEmTorque(m, p.peak, c, w, T, p0, sc);
        expect(Math.abs(m.torque(q.id, q.iq) - T)).toBeLessThan(1e-9 * Math.abs(T));
        expect(q.current).toBeLessThanOrEqual(p.peak.Imax);
        expect(q.voltage).toBeLessThanOrEqual(p.peak.Vmax * (1 + 1e-9));
        const L0 = pointLosses(m, c, w, p0.id, p0.iq, sc);
        const L1 = pointLosses(m, c, w, q.id, q.iq, sc);
        expect(L1).toBeLessThanOrEqual(L0);
        if (L1 < L0 * (1 - 1e-4)) gained++;
        // a dense scan of the same locus (common practice (no source)): nothing found with less loss
        const L: ShaftLocus = { m, c, Imax: p.peak.Imax, w: 0, Ts: T, pMech: 0, sign: T < 0 ? -1 : 1, flux: new Float64Array(2) };
        const v = new Float64Array(2);
        let best = Infinity;
        for (let k = 0; k <= 2000; k++) {
          const id = -p.peak.Imax + (2 * p.peak.Imax * k) / 2000;
          const iq = locusIq(L, id);
          if (Number.isNaN(iq)) continue;
          m.steadyVoltage(id, iq, m.polePairs * w, v);
          if (Math.hypot(v[0]!, v[1]!) > p.peak.Vmax) continue;
          best = Math.min(best, pointLosses(m, c, w, id, iq, sc));
        }
        expect(L1).toBeLessThanOrEqual(best * (1 + 1e-6));
      }
      expect(gained).toBeGreaterThan(0);
    }, 60_000);
  }

  it('keeps the least-current point when there is nothing to gain or nothing to move', () => {
    const p = demo('demo-ipm-traction');
    const c: LossConditions = { Vdc: 350, friction: { B: 0, Tc: 0 }, losses: FULL };
    const sc = newPointLossScratch();
    const zero = solveOperatingPoint(p.models.hot, p.peak, rpm(2000), 0);
    expect(minLossAtEmTorque(p.models.hot, p.peak, c, rpm(2000), 0, zero, sc)).toBe(zero);
    const out = solveOperatingPoint(p.models.hot, p.peak, rpm(2000), 5000);
    expect(out.feasible).toBe(false);
    expect(minLossAtEmTorque(p.models.hot, p.peak, c, rpm(2000), 5000, out, sc)).toBe(out);
  });
});

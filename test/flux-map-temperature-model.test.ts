// The temperature model of a flux-map machine (src/core/machine/flux-map-temperature-model.ts and
// FluxMapModel.retemper): one model, its interpolant built once, re-tempered in place, answers as
// fluxMapAt's model built afresh at the same temperatures (flux, torque, steady voltage, incremental
// inductances and the inverse), to 1e-15. The winding resistance R(T) = R20 (1 + 0.00393 (T - 20))
// is copper's coefficient of IEC 60028 (1925), "International standard of resistance for copper"; the
// psi_d shift is the project's own approximation (flux-map.ts). The map: the saturating demo's,
// sampled from Hinkkanen, Pescetto, Mölsä, Saarakkala, Pellegrino and Bojoi (2017), "Sensorless
// self-commissioning of synchronous reluctance motors at standstill without rotor locking", IEEE
// Trans. Ind. Appl. 53(3) (an invented motor).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { FluxMapModel, fluxMapAt, type FluxMapData } from '../src/core/machine/flux-map';
import { fluxMapTemperatureModel } from '../src/core/machine/flux-map-temperature-model';
import { resistanceAt } from '../src/core/machine/thermal';

const demo = JSON.parse(readFileSync(new URL('../resources/demo-ipm-saturated.json', import.meta.url), 'utf8'));
const MAP: FluxMapData = demo.motor.fluxMap;
const PP: number = demo.motor.polePairs;
const RS20: number = demo.motor.Rs;
const ALPHA = -0.0012;
const POINTS: ReadonlyArray<readonly [number, number]> = [[0, 0], [-120, 300], [-400, 150], [37.5, -222], [-600, 610], [210, 20]];

/** Largest difference between two models' answers over POINTS, relative to the answer's size (0 when they agree bit for bit). */
function worstDifference(a: FluxMapModel, b: FluxMapModel): number {
  const fa = new Float64Array(4), fb = new Float64Array(4);
  let worst = 0;
  const rel = (x: number, y: number): number => (x === y ? 0 : Math.abs(x - y) / Math.max(Math.abs(x), Math.abs(y)));
  for (const [id, iq] of POINTS) {
    a.flux(id, iq, fa); b.flux(id, iq, fb);
    worst = Math.max(worst, rel(fa[0]!, fb[0]!), rel(fa[1]!, fb[1]!));
    worst = Math.max(worst, rel(a.torque(id, iq), b.torque(id, iq)));
    a.steadyVoltage(id, iq, 2000, fa); b.steadyVoltage(id, iq, 2000, fb);
    worst = Math.max(worst, rel(fa[0]!, fb[0]!), rel(fa[1]!, fb[1]!));
    a.incrementalInductance(id, iq, fa); b.incrementalInductance(id, iq, fb);
    for (let k = 0; k < 4; k++) worst = Math.max(worst, rel(fa[k]!, fb[k]!));
  }
  // the inverse, in one order on both, from a fresh state on both
  const fl = new Float64Array(2);
  for (const [id, iq] of POINTS) {
    b.flux(id, iq, fl);
    a.current(fl[0]!, fl[1]!, fa); b.current(fl[0]!, fl[1]!, fb);
    worst = Math.max(worst, rel(fa[0]!, fb[0]!), rel(fa[1]!, fb[1]!));
  }
  return worst;
}

describe('a flux map re-tempered in place', () => {
  it('answers as fluxMapAt at each temperature set, in any order, to 1e-15', () => {
    const tm = fluxMapTemperatureModel(MAP, PP, RS20, ALPHA);
    const m = tm.model as FluxMapModel;
    for (const [w, mag] of [[140, 120], [20, 20], [-20, -20], [155, 95.5], [40, 40], [140, 120]] as const) {
      tm.setTemperatures(w, mag);
      const fresh = fluxMapAt(MAP, PP, resistanceAt(RS20, w), mag, ALPHA);
      expect(worstDifference(m, fresh), `${w} °C, ${mag} °C`).toBeLessThanOrEqual(1e-15);
      expect(m.Rs).toBe(fresh.Rs);
      expect(m.psidShift_Wb).toBe(fresh.psidShift_Wb);
      // the model is the same object every time
      expect(tm.model).toBe(m);
    }
  });

  it('is at 20 °C until set: Rs20 and psi_d shifted from the map\'s own magnet temperature to 20 °C', () => {
    const tm = fluxMapTemperatureModel({ ...MAP, magnetTemp_C: 60 }, PP, RS20, ALPHA);
    const fresh = fluxMapAt({ ...MAP, magnetTemp_C: 60 }, PP, RS20, 20, ALPHA);
    expect(tm.model.Rs).toBe(RS20);
    expect(worstDifference(tm.model as FluxMapModel, fresh)).toBeLessThanOrEqual(1e-15);
    // the magnet 40 K below the map: psi_d(0, 0) up by 0.0012 x 40 = 4.8 % of the map's (from the remanence coefficient)
    const f0 = new Float64Array(2), f = new Float64Array(2);
    new FluxMapModel(MAP, PP, RS20).flux(0, 0, f0);
    tm.model.flux(0, 0, f);
    expect(f[0]! / f0[0]!).toBeCloseTo(1.048, 14);
  });

  it('re-tempering a model changes its answers: the winding at 120 °C has 1.393 times its 20 °C resistance', () => {
    const tm = fluxMapTemperatureModel(MAP, PP, RS20, ALPHA);
    const v20 = new Float64Array(2), v120 = new Float64Array(2);
    tm.model.steadyVoltage(0, 100, 0, v20);
    tm.setTemperatures(120, 20);
    tm.model.steadyVoltage(0, 100, 0, v120);
    expect(v120[1]! / v20[1]!).toBeCloseTo(1.393, 12); // 1 + 0.00393 x 100 (IEC 60028 copper)
  });
});

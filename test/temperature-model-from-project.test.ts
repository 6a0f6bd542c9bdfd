// The temperature model of a project's machine (src/core/project/temperature-model-from-project.ts):
// a constant-parameter motor (motor section or nameplate) re-tempered from its 20 °C terms, a flux-map
// motor from its map; at the project's hot and cold corners each answers as the resolution's own
// models there (to 1e-15), and each call gives a new model (a run's own). Copper's coefficient:
// IEC 60028 (1925), "International standard of resistance for copper"; the remanence coefficient of
// the demos (-0.0012 /K, sintered NdFeB) from memory.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadProjectText, type ResolvedProject } from '../src/core/project/project';
import { temperatureModelFromProject } from '../src/core/project/temperature-model-from-project';
import { FluxMapModel } from '../src/core/machine/flux-map';
import type { MachineModel } from '../src/core/machine/machine-model';
import { constProject, mapProject } from './flux-map-fixtures';

const demo = (name: string): ResolvedProject => loadProjectText(readFileSync(new URL(`../resources/${name}`, import.meta.url), 'utf8'));
const POINTS: ReadonlyArray<readonly [number, number]> = [[0, 0], [-120, 300], [-400, 150], [37.5, -222], [210, 20]];

/** Largest relative difference of flux, torque and steady voltage over POINTS (0 when bit for bit). */
function worst(a: MachineModel, b: MachineModel): number {
  const x = new Float64Array(2), y = new Float64Array(2);
  const rel = (p: number, q: number): number => (p === q ? 0 : Math.abs(p - q) / Math.max(Math.abs(p), Math.abs(q)));
  let w = 0;
  for (const [id, iq] of POINTS) {
    a.flux(id, iq, x); b.flux(id, iq, y);
    w = Math.max(w, rel(x[0]!, y[0]!), rel(x[1]!, y[1]!), rel(a.torque(id, iq), b.torque(id, iq)));
    a.steadyVoltage(id, iq, 1500, x); b.steadyVoltage(id, iq, 1500, y);
    w = Math.max(w, rel(x[0]!, y[0]!), rel(x[1]!, y[1]!));
  }
  return w;
}

/** The temperature model set to the project's hot and cold corners, against the resolution's models there. */
function cornersAgree(p: ResolvedProject): void {
  const tm = temperatureModelFromProject(p);
  const c = p.conditions;
  tm.setTemperatures(c.windingTemp_C, c.magnetTemp_C);
  expect(worst(tm.model, p.models.hot), 'hot corner').toBeLessThanOrEqual(1e-15);
  expect(tm.model.Rs).toBe(p.models.hot.Rs);
  tm.setTemperatures(c.coldTemp_C, c.coldTemp_C);
  expect(worst(tm.model, p.models.cold), 'cold corner').toBeLessThanOrEqual(1e-15);
  tm.setTemperatures(20, 20);
  expect(worst(tm.model, p.models.at20), '20 °C').toBeLessThanOrEqual(1e-15);
}

describe('temperatureModelFromProject', () => {
  it('a constant-parameter motor section: the linear model, at the corners as the resolution', () => {
    const p = loadProjectText(JSON.stringify(constProject()));
    const tm = temperatureModelFromProject(p);
    expect(tm.model.linear).not.toBeNull();
    cornersAgree(p);
    // the winding at 140 °C: 1 + 0.00393 x 120 = 1.4716 times its 20 °C resistance (IEC 60028 copper)
    tm.setTemperatures(140, 20);
    expect(tm.model.Rs / p.machine20.Rs).toBeCloseTo(1.4716, 14);
  });

  it('a nameplate (the traction demo) and the servo and 48 V demos: linear, at the corners as the resolution', () => {
    for (const name of ['demo-ipm-traction.json', 'demo-servo-axis.json', 'demo-spm-48v.json']) {
      const p = demo(name);
      expect(temperatureModelFromProject(p).model.linear, name).not.toBeNull();
      cornersAgree(p);
    }
  });

  it('a flux-map motor (a tabulated map, the saturating demo): the map re-tempered, at the corners as the resolution', () => {
    for (const p of [loadProjectText(JSON.stringify(mapProject())), demo('demo-ipm-saturated.json')]) {
      const tm = temperatureModelFromProject(p);
      expect(tm.model).toBeInstanceOf(FluxMapModel);
      expect(tm.model.linear).toBeNull();
      cornersAgree(p);
    }
  });

  it('each call gives a new model, never one of the resolution\'s', () => {
    const p = demo('demo-ipm-saturated.json');
    const a = temperatureModelFromProject(p), b = temperatureModelFromProject(p);
    expect(a.model).not.toBe(b.model);
    for (const m of [p.models.at20, p.models.hot, p.models.cold]) expect(a.model).not.toBe(m);
    const hotRs = p.models.hot.Rs;
    a.setTemperatures(-40, -40);
    expect(p.models.hot.Rs).toBe(hotRs);
  });
});

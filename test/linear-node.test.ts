// The constant-parameter plant's derivative at a node (src/core/simulation/linear-node.ts) against the
// plant's own derivative (plant.ts), and its time derivatives against central differences along the
// trajectory (common practice (no source)).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { ENERGY, I_D, I_Q, OMEGA, Plant } from '../src/core/simulation/plant';
import { LinearNode } from '../src/core/simulation/linear-node';

const demo = (name: string) => JSON.parse(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));

describe('LinearNode', () => {
  for (const name of ['demo-ipm-traction', 'demo-servo-axis']) {
    it(`${name}: di/dt, the acceleration and the power as the plant's derivative; their time derivatives as central differences`, () => {
      const s = simulationFromProject(loadProjectText(JSON.stringify(demo(name))));
      const plant = new Plant({ ...s.plant, inputFrame: 'dq' });
      plant.segmented = true;
      plant.loadA = 2; plant.loadB = 30;
      const n = new LinearNode(plant);
      n.LA = 2; n.LB = 30;
      const id = -20, iq = 35, w = 150, vd = -40, vq = 90, t = 0.01;
      plant.input[0] = vd; plant.input[1] = vq;
      n.at(Float64Array.of(id, iq, w, vd, vq, t));
      const y = Float64Array.of(id, iq, w, 0.3, 0), dy = new Float64Array(5);
      plant.derivInto(dy, y, t);
      expect(n.nd).toBeCloseTo(dy[I_D]!, 6);
      expect(n.nq).toBeCloseTo(dy[I_Q]!, 6);
      expect(n.ng / dy[OMEGA]!).toBeCloseTo(1, 12);
      expect(n.np / dy[ENERGY]!).toBeCloseTo(1, 12);
      // along the trajectory, the voltage held in the stationary frame (so in dq it turns: vd' = we vq, vq' = -we vd):
      // g' and P' by central differences of the node itself
      const we = plant.model.polePairs * w;
      const h = 1e-6, gAt = (k: number) => {
        n.at(Float64Array.of(id + k * h * dy[I_D]!, iq + k * h * dy[I_Q]!, w + k * h * dy[OMEGA]!, vd + k * h * we * vq, vq - k * h * we * vd, t + k * h));
        return [n.ng, n.np] as const;
      };
      n.at(Float64Array.of(id, iq, w, vd, vq, t));
      const gp = n.ngp, pp = n.npp;
      const [g1, p1] = gAt(1), [g0, p0] = gAt(-1);
      expect(((g1 - g0) / (2 * h)) / gp).toBeCloseTo(1, 5);
      expect(((p1 - p0) / (2 * h)) / pp).toBeCloseTo(1, 5);
    });
  }
  it('the friction taken early at one speed and the node after it, as the node in one call (the same arithmetic); the friction kept for its speed (common practice, no source)', () => {
    const s = simulationFromProject(loadProjectText(JSON.stringify(demo('demo-ipm-traction'))));
    const plant = new Plant({ ...s.plant, inputFrame: 'dq' });
    const a = new LinearNode(plant), b = new LinearNode(plant);
    a.LA = b.LA = 1.5; a.LB = b.LB = -20;
    a.at(Float64Array.of(-30, 60, 0.02, -25, 70, 0.2)); // the speed within the friction's smoothing width
    b.xW = 0.02;
    b.friction();
    b.xId = -30; b.xIq = 60; b.xVd = -25; b.xVq = 70; b.xT = 0.2;
    b.evaluateWithFriction();
    expect([b.nd, b.nq, b.ng, b.ngp, b.np, b.npp]).toEqual([a.nd, a.nq, a.ng, a.ngp, a.np, a.npp]);
    // a stale friction: evaluateWithFriction at another speed keeps the old one, evaluate takes the new
    b.xW = 150;
    b.evaluateWithFriction();
    const stale = b.ng;
    b.evaluate();
    a.at(Float64Array.of(-30, 60, 150, -25, 70, 0.2));
    expect(b.ng).toBe(a.ng);
    expect(stale).not.toBe(a.ng);
  });
});

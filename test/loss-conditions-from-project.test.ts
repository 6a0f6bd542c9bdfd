import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { solveLossPoint } from '../src/core/steady-state/loss-point';

const demo = (n: string) => loadProjectText(readFileSync(new URL(`../resources/${n}.json`, import.meta.url), 'utf8'));

describe('the loss conditions of a project', () => {
  it("pass the file's losses, the bus and the friction through (the traction demo's invented data)", () => {
    const p = demo('demo-ipm-traction');
    const c = lossConditionsFromProject(p);
    expect(c.Vdc).toBe(350);
    expect(c.friction).toEqual({ B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction });
    expect(c.losses.inverter).toMatchObject({ Vce0: p.losses.inverter!.Vce0, Vref_V: p.losses.inverter!.Vref_V, fsw_Hz: p.losses.inverter!.fsw_Hz });
    expect(c.losses.iron).toEqual(p.losses.iron);
  });

  it('a project without losses has only copper and friction: motor efficiency = shaft power / (shaft + copper + friction) (common practice (no source): power balance)', () => {
    const p = demo('demo-ipm-traction');
    const bare = { ...p, losses: {} };
    const c = lossConditionsFromProject(bare);
    expect(c.losses).toEqual({});
    const w = 3000 * Math.PI / 30;
    const r = solveLossPoint(p.models.hot, p.peak, c, w, 50);
    expect(r.losses.iron_W).toBe(0);
    expect(r.losses.inverter_W).toBe(0);
    const shaft = 50 * w;
    expect(r.efficiency.motor).toBeCloseTo(shaft / (shaft + r.losses.copper_W + r.losses.mechanical_W), 9);
  });
});

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadProject, loadProjectJson } from '../src/core/project/project';
import { resolveVariants } from '../src/core/project/variant-overrides';
import { compareVariants, comparisonSpeedMax, requirementEfficiencies, variantLoadSteps, variantSteady } from '../src/core/reports/variant-comparison';

const spmText = readFileSync(new URL('../resources/demo-spm-48v.json', import.meta.url), 'utf8');
const spmJson = (): Record<string, any> => JSON.parse(spmText);

/** The demo with named variants, resolved: the base first, then each variant. */
function withVariants(variants: unknown[]) {
  const f = { ...spmJson(), variants };
  const loaded = loadProject(JSON.stringify(f));
  return [{ name: 'base', project: loaded.resolved }, ...resolveVariants(loaded.file)];
}

describe('variant comparison', () => {
  it('a variant identical to the base gives identical columns, envelopes, sizing, efficiency and load steps (common practice (no source))', () => {
    const cols = compareVariants(withVariants([{ name: 'same', overrides: {} }]), { points: 40 });
    const strip = ({ name: _n, loadSteps: { wall_s: _w, name: _m, ...ls }, ...rest }: (typeof cols)[number]) => ({ ...rest, loadSteps: ls });
    expect(cols.map((c) => c.name)).toEqual(['base', 'same']);
    expect(strip(cols[1]!)).toEqual(strip(cols[0]!));
    expect(cols[0]!.loadSteps.simulated).toBe(true);
    expect(cols[0]!.loadSteps.metrics!.loadStepDip_rpm).toBeGreaterThan(0);
  });

  it('a psiM override moves Kt by the same ratio, and a surface-magnet motor\'s standstill torque at Imax with it: T = 1.5 p psiM Imax (Krishnan 2010, Permanent Magnet Synchronous and Brushless DC Motor Drives)', () => {
    const vs = withVariants([{ name: '+10 % magnet', overrides: { 'motor.psiM': 0.0095 * 1.1 } }]);
    const top = comparisonSpeedMax(vs);
    const [a, b] = vs.map((v) => variantSteady(v, top, 40));
    expect(b!.constantsHot.Kt_Nm_per_Apeak / a!.constantsHot.Kt_Nm_per_Apeak).toBeCloseTo(1.1, 12);
    expect(b!.constantsCold.Kt_Nm_per_Apeak / a!.constantsCold.Kt_Nm_per_Apeak).toBeCloseTo(1.1, 12);
    // Ld = Lq: at standstill the whole current limit is on q (MTPA id = 0)
    const p = vs[1]!.project;
    expect(b!.envelopes.hot.torque[0]).toBeCloseTo(1.5 * p.hot.polePairs * p.hot.psiM * p.peak.Imax, 6);
    expect(b!.envelopes.hot.torque[0]! / a!.envelopes.hot.torque[0]!).toBeCloseTo(1.1, 6);
    // one speed range for both, so the curves overlay point by point
    expect(Array.from(b!.envelopes.hot.speed)).toEqual(Array.from(a!.envelopes.hot.speed));
  });

  it('efficiency at a motoring point is the shaft power over the shaft power plus the losses (energy balance, common practice (no source))', () => {
    const p = loadProject(spmText).resolved;
    const e = requirementEfficiencies(p)!;
    const rated = e.find((q) => q.label === 'rated')!;
    const shaft = rated.torque_Nm * rated.speed_rpm * (2 * Math.PI / 60);
    expect(rated.feasible).toBe(true);
    expect(rated.system).toBeCloseTo(shaft / (shaft + rated.losses_W!), 9);
    expect(rated.system!).toBeLessThan(rated.motor!);
  });

  it('a file without losses has no efficiency, and one without a scenario is not simulated', () => {
    const f = spmJson();
    delete f.losses;
    delete f.scenario;
    const v = { name: 'bare', project: loadProjectJson(f).resolved };
    expect(requirementEfficiencies(v.project)).toBeNull();
    expect(variantLoadSteps(v)).toEqual({ name: 'bare', simulated: false, metrics: null, loadSteps: [], wall_s: 0 });
  });
});

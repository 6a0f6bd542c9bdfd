// A set of parameter values applied to a validated file (src/core/project/tolerance-apply.ts):
// a pure copy, each path changing what tolerance-schema.ts says. Common practice (no source).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseProject } from '../src/core/project/schema';
import { applyParameterValues, bandEnds, checkBandEnds, nominalValue, toleranceParameters } from '../src/core/project/tolerance-apply';
import { resolveProject } from '../src/core/project/project';
import { linearSpm } from './tolerance-fixtures';

const demo = (d: string) => parseProject(JSON.parse(readFileSync(join(__dirname, '..', 'resources', `demo-${d}.json`), 'utf8')));

describe('tolerance parameters and their application', () => {
  it('bands: percent about the nominal value, or absolute ends', () => {
    expect(bandEnds(200, { minus_pct: 5, plus_pct: 10 })).toEqual({ min: 190, max: 220.00000000000003 });
    expect(bandEnds(350, { min: 300, max: 400 })).toEqual({ min: 300, max: 400 });
  });

  it('the parameters in the fixed path order whatever the file order, with nominal values', () => {
    const f = parseProject(linearSpm({ 'inverter.Imax': { minus_pct: 5, plus_pct: 5 }, 'motor.psiM': { min: 0.018, max: 0.022 } }));
    const ps = toleranceParameters(f);
    expect(ps.map((p) => p.path)).toEqual(['motor.psiM', 'inverter.Imax']);
    expect(ps[0]).toMatchObject({ nominal: 0.02, min: 0.018, max: 0.022, unit: 'Wb' });
    expect(ps[1]).toMatchObject({ nominal: 100, min: 95, max: 105, unit: 'A' });
  });

  it('a pure copy: the file is left as it was, the values land where named, Icont follows an Imax below it', () => {
    const f = parseProject(linearSpm({ 'inverter.Imax': { min: 40, max: 120 }, 'motor.psiM': { minus_pct: 10, plus_pct: 10 }, 'inverter.Vdc': { min: 300, max: 400 } }));
    const before = JSON.stringify(f);
    const ps = toleranceParameters(f);
    const g = applyParameterValues(f, ps, [0.021, 300, 40]);
    expect(JSON.stringify(f)).toBe(before);
    expect(g.motor!.psiM).toBe(0.021);
    expect(g.inverter.Vdc).toBe(300);
    expect(g.inverter.Imax).toBe(40);
    expect(g.inverter.Icont).toBe(40);
    expect(resolveProject(g).models.hot.psiM).toBeCloseTo(0.021, 12);
  });

  it('nameplate terms: the value in its stated unit, the resolved model follows (Ke in V rms line-to-line per krpm)', () => {
    const f = demo('ipm-traction');
    const ps = toleranceParameters(f);
    const k = ps.findIndex((p) => p.path === 'nameplate.Ke');
    const v = ps.map((p) => p.nominal);
    v[k] = ps[k]!.nominal * 1.03;
    const g = applyParameterValues(f, ps, v);
    expect(g.nameplate!.Ke!.value).toBeCloseTo(33.1 * 1.03, 12);
    // psiM is proportional to Ke: the 20 °C model's magnet flux rises by the same 3 %
    expect(resolveProject(g).machine20.psiM / resolveProject(f).machine20.psiM).toBeCloseTo(1.03, 12);
  });

  it("a flux map's magnet flux shifts the whole psi_d table; its scale multiplies psi_d - psi_d(0, 0) and psi_q", () => {
    const f = demo('ipm-saturated');
    const ps = toleranceParameters(f);
    const psi0 = nominalValue(f, 'motor.fluxMap.magnetFlux');
    expect(psi0).toBeGreaterThan(0.05);
    const iF = ps.findIndex((p) => p.path === 'motor.fluxMap.magnetFlux'), iS = ps.findIndex((p) => p.path === 'motor.fluxMap.scale');
    const v = ps.map((p) => p.nominal);
    v[iF] = psi0 + 0.002;
    const shifted = applyParameterValues(f, ps, v);
    expect(nominalValue(shifted, 'motor.fluxMap.magnetFlux')).toBeCloseTo(psi0 + 0.002, 12);
    expect(shifted.motor!.fluxMap!.psid_Wb[3]![7]! - f.motor!.fluxMap!.psid_Wb[3]![7]!).toBeCloseTo(0.002, 12);
    v[iF] = psi0;
    v[iS] = 1.05;
    const scaled = applyParameterValues(f, ps, v);
    expect(nominalValue(scaled, 'motor.fluxMap.magnetFlux')).toBeCloseTo(psi0, 12);
    expect(scaled.motor!.fluxMap!.psiq_Wb[10]![20]!).toBeCloseTo(1.05 * f.motor!.fluxMap!.psiq_Wb[10]![20]!, 12);
    expect(scaled.motor!.fluxMap!.psid_Wb[5]![5]! - psi0).toBeCloseTo(1.05 * (f.motor!.fluxMap!.psid_Wb[5]![5]! - psi0), 12);
    // the incremental inductances at zero current scale by the same factor
    expect(resolveProject(scaled).machine20.Lq / resolveProject(f).machine20.Lq).toBeCloseTo(1.05, 9);
  });

  it('a band end the file cannot take is refused at its tolerance path, naming the end and the reason', () => {
    const j = linearSpm({ 'inverter.Vdc': { min: 1, max: 400 } });
    j.inverter.deviceDrop = 1;
    const f = parseProject(j);
    expect(() => checkBandEnds(f, toleranceParameters(f))).toThrow(/^tolerances\.inverter\.Vdc has its lower end at 1 V, which the file cannot take: inverter\.deviceDrop must be < half of inverter\.Vdc/);
  });
});

// The tolerances section (src/core/project/tolerance-schema.ts): bands by parameter path and the
// Monte Carlo settings; common practice (no source) for the shape of a tolerance band.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkProject, parseProject } from '../src/core/project/schema';
import { allowedTolerancePaths, TOLERANCE_PATHS } from '../src/core/project/tolerance-schema';
import { loadProject } from '../src/core/project/project';
import { linearSpm } from './tolerance-fixtures';
import { toleranceParameters } from '../src/core/project/tolerance-apply';

describe('tolerances section', () => {
  it('takes percent and absolute bands and fills the Monte Carlo defaults', () => {
    const f = parseProject(linearSpm({ 'motor.psiM': { minus_pct: 5, plus_pct: 5 }, 'inverter.Vdc': { min: 300, max: 400 } }));
    expect(f.tolerances?.['motor.psiM']).toEqual({ minus_pct: 5, plus_pct: 5 });
    expect(f.tolerances?.['inverter.Vdc']).toEqual({ min: 300, max: 400 });
    expect(f.tolerances?.['monteCarlo']).toEqual({ samples: 1000, seed: 1, distribution: 'uniform', sigmaOfBand: 0.33 });
  });

  it('refuses an unknown key, naming it and listing the allowed ones', () => {
    const p = checkProject(linearSpm({ 'motor.Kt': { minus_pct: 5, plus_pct: 5 } }));
    expect(p).toHaveLength(1);
    expect(p[0]!.path).toBe('tolerances.motor.Kt');
    expect(p[0]!.message).toContain('is not a parameter a tolerance may name (allowed: motor.Rs, motor.psiM');
  });

  it('a parameter this file does not have (a nameplate term on a motor section) is a warning naming it and what it may name, and is left out of the study', () => {
    const j = linearSpm({ 'nameplate.Ke': { minus_pct: 5, plus_pct: 5 }, 'motor.psiM': { minus_pct: 5, plus_pct: 5 } });
    expect(checkProject(j)).toEqual([]);
    const { resolved } = loadProject(JSON.stringify(j));
    const f = resolved!.findings.filter((x) => x.code === 'tolerance-band-unused');
    expect(f).toEqual([{ code: 'tolerance-band-unused', severity: 'warning', field: 'tolerances.nameplate.Ke',
      message: 'tolerances.nameplate.Ke names a parameter this file does not have, so corners and samples leave it out (allowed for this file: motor.Rs, motor.psiM, motor.Ld, motor.Lq, inverter.Vdc, inverter.Imax).' }]);
    expect(toleranceParameters(parseProject(j)).map((q) => q.path)).toEqual(['motor.psiM']);
    // no thermal section: a coolant band is said unused too
    const { resolved: r2 } = loadProject(JSON.stringify(linearSpm({ 'thermal.coolantTemp_C': { min: 20, max: 40 } })));
    expect(r2!.findings.find((x) => x.code === 'tolerance-band-unused')?.field).toBe('tolerances.thermal.coolantTemp_C');
  });

  it('refuses a band with min above max, a negative percent, and bad Monte Carlo settings, each at its path', () => {
    expect(checkProject(linearSpm({ 'inverter.Vdc': { min: 400, max: 300 } }))[0]!.path).toMatch(/^tolerances\.inverter\.Vdc/);
    expect(checkProject(linearSpm({ 'motor.Rs': { minus_pct: -1, plus_pct: 5 } }))[0]!.path).toMatch(/^tolerances\.motor\.Rs/);
    expect(checkProject(linearSpm({ monteCarlo: { samples: 0 } }))[0]).toEqual({ path: 'tolerances.monteCarlo.samples', message: 'must be >= 1' });
    expect(checkProject(linearSpm({ monteCarlo: { distribution: 'cauchy' } }))[0]!.message).toBe('must be one of "uniform", "normal"');
  });

  it('allows by the form of the motor: constant terms, flux map, nameplate; the coolant with a thermal section', () => {
    expect(allowedTolerancePaths({ motor: { fluxMap: {} }, thermal: {} })).toEqual(['motor.Rs', 'motor.fluxMap.magnetFlux', 'motor.fluxMap.scale', 'inverter.Vdc', 'inverter.Imax', 'thermal.coolantTemp_C']);
    expect(allowedTolerancePaths({ nameplate: { Ke: {}, Ld: {}, Lq: {} } })).toEqual(['nameplate.R', 'nameplate.Ke', 'nameplate.Ld', 'nameplate.Lq', 'inverter.Vdc', 'inverter.Imax']);
    expect(TOLERANCE_PATHS).toHaveLength(15);
  });

  it('a key given twice inside a band is named by its dotted parameter path, as the schema names it', () => {
    const text = JSON.stringify(linearSpm({ 'motor.Rs': { minus_pct: 5, plus_pct: 5 } })).replace('"minus_pct":5', '"minus_pct":5,"minus_pct":6');
    expect(() => loadProject(text)).toThrow(/^tolerances\.motor\.Rs\.minus_pct is given twice in one object/);
  });

  it('every demo carries a valid tolerances section, labelled invented in its note', () => {
    for (const d of ['ipm-traction', 'ipm-saturated', 'servo-axis', 'spm-48v']) {
      const j = JSON.parse(readFileSync(join(__dirname, '..', 'resources', `demo-${d}.json`), 'utf8'));
      expect(checkProject(j), d).toEqual([]);
      expect(Object.keys(j.tolerances).length, d).toBeGreaterThan(4);
      expect(j.note, d).toMatch(/tolerance bands \(tolerances\) are invented too/);
    }
  });
});

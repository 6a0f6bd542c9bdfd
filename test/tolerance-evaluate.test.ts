// One set of parameter values evaluated (src/core/project/tolerance-evaluate.ts): the verdicts of
// the `size` command hot and cold, the margins the worse of the two, the S1 check when asked;
// sizeDrive without its bounds and resolveProject without its findings change no verdict.
// Common practice (no source): a worst case is the worse of the corners.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseProject } from '../src/core/project/schema';
import { resolveProject } from '../src/core/project/project';
import { sizeDrive } from '../src/core/steady-state/sizing';
import { toleranceParameters } from '../src/core/project/tolerance-apply';
import { evaluateParameterSet, relativeMargin } from '../src/core/project/tolerance-evaluate';
import { continuousRequirementChecks } from '../src/core/steady-state/continuous-requirements';
import { temperatureModelFromProject } from '../src/core/project/temperature-model-from-project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';

const demo = (d: string) => parseProject(JSON.parse(readFileSync(join(__dirname, '..', 'resources', `demo-${d}.json`), 'utf8')));

describe('a parameter set evaluated', () => {
  it('at the nominal values: the size verdicts hot and cold, the worse headrooms, both bounds', () => {
    const f = demo('spm-48v');
    const ps = toleranceParameters(f);
    const r = evaluateParameterSet(f, ps, ps.map((p) => p.nominal), { bounds: true, thermal: false });
    const p = resolveProject(f);
    const hot = sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits), cold = sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits);
    expect(r.requirements.map((q) => q.met)).toEqual(hot.points.map((q, k) => q.met && cold.points[k]!.met));
    hot.points.forEach((q, k) => {
      const c = cold.points[k]!;
      expect(r.requirements[k]!.margins.torque_Nm).toBe(Math.min(Math.abs(q.torqueAvailable_Nm), Math.abs(c.torqueAvailable_Nm)) - Math.abs(q.torque_Nm));
      if (q.currentHeadroom_A !== null && c.currentHeadroom_A !== null) expect(r.requirements[k]!.margins.current_A).toBe(Math.min(q.currentHeadroom_A, c.currentHeadroom_A));
    });
    expect(r.minImax_A).toBe(Math.max(hot.minImax!, cold.minImax!));
    expect(r.minVdc_V).toBe(hot.minVdc === null || cold.minVdc === null ? null : Math.max(hot.minVdc, cold.minVdc));
  });

  it('without the bounds: the same verdicts and margins, no least Imax or bus', () => {
    const f = demo('servo-axis');
    const ps = toleranceParameters(f);
    const v = ps.map((p) => p.min);
    const full = evaluateParameterSet(f, ps, v, { bounds: true, thermal: false });
    const quick = evaluateParameterSet(f, ps, v, { bounds: false, thermal: false });
    expect(quick.requirements).toEqual(full.requirements);
    expect(quick.minImax_A).toBeNull();
    expect(quick.minVdc_V).toBeNull();
    // resolveProject without findings: the same machine and limits
    const a = resolveProject(f), b = resolveProject(f, { findings: false });
    expect(b.hot).toEqual(a.hot);
    expect(b.peak).toEqual(a.peak);
    expect(b.cold).toEqual(a.cold);
    expect(b.currentLimits).toEqual(a.currentLimits);
    for (const x of b.findings) expect(a.findings.map((y) => y.code)).toContain(x.code);
  });

  it('with the thermal check: each continuous point against its S1 torque, as continuousRequirementChecks', () => {
    const f = demo('servo-axis');
    const ps = toleranceParameters(f);
    const r = evaluateParameterSet(f, ps, ps.map((p) => p.nominal), { bounds: false, thermal: true });
    const p = resolveProject(f);
    const checks = continuousRequirementChecks(temperatureModelFromProject(p), p.thermal!, p.continuous, lossConditionsFromProject(p), p.requirements);
    const k = p.requirements.findIndex((q) => q.duty === 'continuous');
    expect(r.requirements[k]!.margins.s1Torque_Nm).toBe(Math.abs(checks[0]!.s1Torque_Nm) - Math.abs(checks[0]!.torque_Nm));
    expect(relativeMargin(r.requirements[k]!, p.requirements[k]!.torque_Nm)).toBeLessThanOrEqual(r.requirements[k]!.margins.s1Torque_Nm! / 3 + 1e-15);
    expect(r.requirements.some((q) => q.margins.s1Torque_Nm !== undefined && p.requirements[r.requirements.indexOf(q)]!.duty !== 'continuous')).toBe(false);
  });
});

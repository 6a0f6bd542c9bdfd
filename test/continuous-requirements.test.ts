import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { temperatureModelFromProject } from '../src/core/project/temperature-model-from-project';
import { continuousRequirementChecks } from '../src/core/steady-state/continuous-requirements';
import { continuousTorqueCurve } from '../src/core/steady-state/continuous-torque';

const p = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
const c = lossConditionsFromProject(p);
// a hotter invented network than the demo's, so that the winding (not the current) binds
const NET: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05, statorCapacity_J_per_K: 9000,
  statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10, windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};

describe('continuous requirement points against the S1 curve (IEC 60034-1 duty type S1: held until thermal equilibrium within the limits)', () => {
  it('a point just under the S1 torque is under it and runs at the limit; just over is not; peak points are left out', () => {
    const w = (4000 * Math.PI) / 30;
    const s1 = continuousTorqueCurve(temperatureModelFromProject(p), NET, p.continuous, c, [w])[0]!;
    expect(s1.limitedBy).toBe('winding');
    const reqs = [
      { label: 'under', speed_rpm: 4000, torque_Nm: s1.torque_Nm * 0.999, duty: 'continuous' as const },
      { label: 'over', speed_rpm: 4000, torque_Nm: s1.torque_Nm * 1.01, duty: 'continuous' as const },
      { label: 'peak', speed_rpm: 4000, torque_Nm: 300, duty: 'peak' as const },
      { label: 'braking', speed_rpm: 4000, torque_Nm: -60, duty: 'continuous' as const },
    ];
    const r = continuousRequirementChecks(temperatureModelFromProject(p), NET, p.continuous, c, reqs);
    expect(r.map((q) => q.label)).toEqual(['under', 'over', 'braking']);
    expect(r[0]!.underS1).toBe(true);
    expect(r[0]!.s1Torque_Nm).toBeCloseTo(s1.torque_Nm, 9);
    // 0.1 % below the S1 torque the winding sits just under its limit (copper loss ~ torque^2 near MTPA: about 0.2 % less heat)
    expect(r[0]!.windingTemp_C).toBeLessThan(155);
    expect(r[0]!.windingTemp_C).toBeGreaterThan(155 - 0.004 * (155 - 40));
    expect(r[1]!.underS1).toBe(false);
    expect(r[1]!.windingTemp_C).toBeGreaterThan(155);
    // generating: the S1 torque is looked up on the negative side
    expect(r[2]!.s1Torque_Nm).toBeLessThan(0);
    expect(r[2]!.underS1).toBe(-60 >= r[2]!.s1Torque_Nm);
  });

  it('reversed rotation is the mirror image: (-n, T) is checked as (n, -T), motoring or generating by the sign of the power (symmetry of the dq model under reversal, common practice (no source))', () => {
    const reqs = [
      { label: 'reverse braking', speed_rpm: -4000, torque_Nm: 60, duty: 'continuous' as const },
      { label: 'forward braking', speed_rpm: 4000, torque_Nm: -60, duty: 'continuous' as const },
      { label: 'reverse driving', speed_rpm: -4000, torque_Nm: -80, duty: 'continuous' as const },
      { label: 'forward driving', speed_rpm: 4000, torque_Nm: 80, duty: 'continuous' as const },
    ];
    const r = continuousRequirementChecks(temperatureModelFromProject(p), NET, p.continuous, c, reqs);
    for (const [a, b] of [[0, 1], [2, 3]] as const) {
      expect(r[a]!.s1Torque_Nm).toBeCloseTo(-r[b]!.s1Torque_Nm, 9);
      expect(r[a]!.s1LimitedBy).toBe(r[b]!.s1LimitedBy);
      expect(r[a]!.underS1).toBe(r[b]!.underS1);
      expect(r[a]!.status).toBe(r[b]!.status);
      expect(r[a]!.windingTemp_C).toBeCloseTo(r[b]!.windingTemp_C, 9);
    }
    // braking takes more torque than driving at the same winding temperature (the losses add to it)
    expect(r[0]!.s1Torque_Nm).toBeGreaterThan(0);
    expect(r[0]!.s1Torque_Nm).toBeGreaterThan(-r[2]!.s1Torque_Nm);
  });
});

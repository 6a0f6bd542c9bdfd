// Shared inputs of the duty-cycle tests: the interior-magnet traction demo (invented data) with its
// loss section, and the example thermal network (invented numbers).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { linearTemperatureModel } from '../src/core/machine/temperature-model';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import type { DutyCycleSpec } from '../src/core/simulation/duty-cycle-spec';

export const project = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
export const conditions = lossConditionsFromProject(project);
export const alphaBr = project.conditions.magnetTempCoeff;
export const temperatureModel = () => linearTemperatureModel(project.machine20, alphaBr);

export const THERMAL: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05,
  statorCapacity_J_per_K: 9000, statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10,
  windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};

/** A cycle from breakpoints [t_s, rpm, N·m], sampled every dt_s (linear in between). */
export function sampledCycle(points: ReadonlyArray<readonly [number, number, number]>, dt_s: number, label = 'test cycle'): DutyCycleSpec {
  const t1 = points[points.length - 1]![0], N = Math.round(t1 / dt_s) + 1;
  const s: DutyCycleSpec = { label, t_s: new Float64Array(N), speed_rpm: new Float64Array(N), torque_Nm: new Float64Array(N) };
  let j = 0;
  for (let k = 0; k < N; k++) {
    const t = k === N - 1 ? t1 : k * dt_s;
    while (j < points.length - 2 && points[j + 1]![0] <= t) j++;
    const a = points[j]!, b = points[j + 1]!, f = (t - a[0]) / (b[0] - a[0]);
    s.t_s[k] = t; s.speed_rpm[k] = a[1] + f * (b[1] - a[1]); s.torque_Nm[k] = a[2] + f * (b[2] - a[2]);
  }
  return s;
}

/** The breakpoints themselves as a cycle. */
export const cycleOf = (points: ReadonlyArray<readonly [number, number, number]>, label = 'test cycle'): DutyCycleSpec => ({
  label, t_s: Float64Array.from(points, (p) => p[0]), speed_rpm: Float64Array.from(points, (p) => p[1]), torque_Nm: Float64Array.from(points, (p) => p[2]),
});

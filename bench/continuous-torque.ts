/**
 * S1 curve bench: the continuous (S1) torque at 200 speeds from standstill to 12 600 rpm on the
 * interior-magnet traction demo (its loss data) with the invented thermal network of issue 13's
 * example, thermally coupled, motoring. Target: under 200 ms. Median of repeated runs after a
 * warm-up (the first, cold run is printed too), same process; the peak envelope of the same 200
 * speeds is timed beside it for scale.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import { linearTemperatureModel } from '../src/core/machine/temperature-model';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { continuousTorqueCurve } from '../src/core/steady-state/continuous-torque';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { peakDuration, peakDurationCurve } from '../src/core/steady-state/peak-duration';
import type { BenchSection } from './index';

const N = 200;
const TARGET_MS = 200;
// invented thermal data (issue 13's example)
const NET: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05, statorCapacity_J_per_K: 9000,
  statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10, windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

export const continuousTorqueBench: BenchSection = {
  name: 'S1 continuous torque (200 speeds, traction demo, coupled thermal)',
  run() {
    const p = loadProjectText(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8'));
    const c = lossConditionsFromProject(p);
    const wMax = (12600 * Math.PI) / 30;
    const speeds = Float64Array.from({ length: N }, (_, k) => (wMax * k) / (N - 1));
    const times: number[] = [], env: number[] = [];
    let cold = 0, binds = '';
    for (let rep = 0; rep < 8; rep++) {
      const tm = linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);
      const t0 = performance.now();
      const curve = continuousTorqueCurve(tm, NET, p.continuous, c, speeds);
      const dt = performance.now() - t0;
      if (rep === 0) cold = dt;
      else times.push(dt);
      const counts = new Map<string, number>();
      for (const q of curve) counts.set(q.limitedBy, (counts.get(q.limitedBy) ?? 0) + 1);
      binds = [...counts].map(([k, v]) => `${k} ${v}`).join(', ');
      const t1 = performance.now();
      computeEnvelope(p.models.hot, p.peak, { points: N, speedMax: wMax });
      env.push(performance.now() - t1);
    }
    const med = median(times);
    console.log(`${N} speeds (bound by ${binds}): median ${med.toFixed(1)} ms, first run ${cold.toFixed(1)} ms (target < ${TARGET_MS} ms: ${med < TARGET_MS ? 'met' : 'NOT met'}); peak envelope of the same speeds ${median(env).toFixed(1)} ms (ratio ${(med / median(env)).toFixed(2)})`);
  },
};

/**
 * Peak-duration bench (no target in the issue): from half the S1 torque at 4000 rpm (field weakening,
 * the dearest loss points), the duration of a 150 N·m overload, and the curve of 10 overload torques.
 */
export const peakDurationBench: BenchSection = {
  name: 'peak duration (traction demo, 4000 rpm, coupled thermal)',
  run() {
    const p = loadProjectText(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8'));
    const c = lossConditionsFromProject(p);
    const w = (4000 * Math.PI) / 30;
    const tm = linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);
    const s1 = continuousTorqueCurve(tm, NET, p.continuous, c, [w])[0]!;
    const from = { speed_rad_s: w, torque_Nm: 0.5 * s1.torque_Nm };
    const one: number[] = [], curve: number[] = [];
    let d = 0, steps = 0;
    for (let rep = 0; rep < 4; rep++) {
      const t0 = performance.now();
      const r = peakDuration(tm, NET, p.peak, p.continuous, c, from, { speed_rad_s: w, torque_Nm: 150 });
      one.push(performance.now() - t0);
      d = r.duration_s; steps = r.steps;
      const t1 = performance.now();
      peakDurationCurve(tm, NET, p.peak, p.continuous, c, from, w, 10);
      curve.push(performance.now() - t1);
    }
    console.log(`S1 ${s1.torque_Nm.toFixed(1)} N·m at 4000 rpm; 150 N·m from ${from.torque_Nm.toFixed(1)} N·m lasts ${d.toFixed(2)} s (${steps} steps): median ${median(one).toFixed(0)} ms; curve of 10 torques ${median(curve).toFixed(0)} ms`);
  },
};

/**
 * Duty-cycle bench: an invented 30-minute cycle sampled at 10 ms (180 001 instants: ramps of 1..8 s
 * between held points of 4..40 s, motoring and braking, up to 10000 rpm) on the interior-magnet
 * traction demo with its loss data and the example thermal network, the whole evaluation
 * (repeats included) with the default adaptive knots; also the exact evaluation (every instant
 * solved) once, for the error of the adaptive one. Target: under 1 s. Median of repeated runs after a
 * warm-up, same process (wall time, and this process's CPU time, less disturbed by other load).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { linearTemperatureModel } from '../src/core/machine/temperature-model';
import type { ThermalNetworkSpec } from '../src/core/machine/thermal-network-spec';
import type { DutyCycleSpec } from '../src/core/simulation/duty-cycle-spec';
import { evaluateDutyCycle, type DutyCycleOptions, type DutyCycleResult } from '../src/core/simulation/duty-cycle';
import type { BenchSection } from './index';

const TARGET_MS = 1000;

/** the example network (invented numbers) */
export const EXAMPLE_THERMAL: ThermalNetworkSpec = {
  coolantTemp_C: 40, windingCapacity_J_per_K: 900, windingToStator_K_per_W: 0.05,
  statorCapacity_J_per_K: 9000, statorToCoolant_K_per_W: 0.02, magnetAboveStator_K: 10,
  windingMax_C: 155, magnetMax_C: 140, junctionToCoolant_K_per_W: 0.15, junctionMax_C: 150,
};

/** An invented cycle: held points joined by ramps, sampled every dt_s over duration_s (deterministic). */
export function inventedCycle(duration_s: number, dt_s: number): DutyCycleSpec {
  let seed = 12345;
  const rnd = (): number => { seed = (seed * 1103515245 + 12345) % 2147483648; return seed / 2147483648; };
  const knots: Array<[number, number, number]> = [[0, 0, 0]];
  let t = 0;
  while (t < duration_s) {
    const v = rnd() < 0.1 ? 0 : 500 + 9500 * rnd();
    const tmax = Math.min(150, (150 * 4000) / Math.max(v, 4000)) * 0.7;
    const T = (rnd() < 0.25 ? -0.6 : 1) * tmax * rnd();
    t += 1 + 7 * rnd(); knots.push([t, v, T]);
    t += 4 + 36 * rnd(); knots.push([t, v, T]);
  }
  const N = Math.round(duration_s / dt_s) + 1;
  const s: DutyCycleSpec = { label: 'invented 30-minute cycle', t_s: new Float64Array(N), speed_rpm: new Float64Array(N), torque_Nm: new Float64Array(N) };
  let j = 0;
  for (let k = 0; k < N; k++) {
    const tk = k === N - 1 ? duration_s : k * dt_s;
    while (knots[j + 1]![0] <= tk) j++;
    const [ta, va, Ta] = knots[j]!, [tb, vb, Tb] = knots[j + 1]!;
    const f = (tk - ta) / (tb - ta);
    s.t_s[k] = tk; s.speed_rpm[k] = va + f * (vb - va); s.torque_Nm[k] = Ta + f * (Tb - Ta);
  }
  // end where it started, so that the repeats join
  s.speed_rpm[N - 1] = 0; s.torque_Nm[N - 1] = 0;
  return s;
}

export function benchSetup(): { run: (o?: DutyCycleOptions) => DutyCycleResult } {
  const p = loadProjectText(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8'));
  const c = lossConditionsFromProject(p);
  const cycle = inventedCycle(1800, 0.01);
  const tm = linearTemperatureModel(p.machine20, p.conditions.magnetTempCoeff);
  return { run: (o = {}) => evaluateDutyCycle(cycle, EXAMPLE_THERMAL, tm, c, p.peak, o)! };
}

export const dutyCycleBench: BenchSection = {
  name: 'duty cycle (30 min at 10 ms, traction demo)',
  run() {
    const b = benchSetup();
    const times: number[] = [], cpu: number[] = [];
    let r: DutyCycleResult | undefined;
    for (let rep = 0; rep < 6; rep++) {
      const t0 = performance.now(), c0 = process.cpuUsage();
      r = b.run();
      const c1 = process.cpuUsage(c0);
      if (rep > 0) { times.push(performance.now() - t0); cpu.push((c1.user + c1.system) / 1000); }
    }
    times.sort((a, c) => a - c);
    cpu.sort((a, c) => a - c);
    const med = times[Math.floor(times.length / 2)]!;
    const t0 = performance.now();
    const ex = b.run({ solve: 'every-instant' });
    const exMs = performance.now() - t0;
    const dT = Math.max(...['winding_C', 'stator_C'].map((k) => {
      const a = r!.traces[k as 'winding_C'], e = ex.traces[k as 'winding_C'];
      let m = 0;
      for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]! - e[i]!));
      return m;
    }));
    console.log(`${r!.t_s.length} instants, ${r!.repeats} repeats, ${r!.solves.total} loss points solved: median ${med.toFixed(0)} ms wall, ${cpu[Math.floor(cpu.length / 2)]!.toFixed(0)} ms CPU (target < ${TARGET_MS} ms: ${med < TARGET_MS ? 'met' : 'NOT met'})`);
    console.log(`every instant solved: ${exMs.toFixed(0)} ms, ${ex.repeats} repeats; largest temperature difference from it ${dT.toFixed(4)} K; energy balance residual ${r!.energies.balanceResidual.toExponential(1)} (exact run ${ex.energies.balanceResidual.toExponential(1)})`);
  },
};

/**
 * Angle-source bench: one second of the traction demo (its speed step plus load step) at 10 kHz
 * control with the true angle (ideal), an encoder (2048 lines, speed over 4 periods through a 200 Hz filter: unfiltered, its 18 rpm steps through this
 * demo's speed gain trip the current-oscillation watchdog) and a resolver
 * (tracking loop of 300 Hz), alternating runs in the same process so that load from other processes
 * falls on all alike; the fastest and the median of each, and the cost per control period as a ratio
 * to ideal. Target (issue 15): an encoder or a resolver adds at most 25 % per control period.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import type { SimulationResult, SimulationSetup } from '../src/core/simulation/simulate';
import type { MachineInput } from '../src/core/machine/machine-model';
import type { BenchSection } from './index';

const REPEATS = 11;
const TIMED = { wallBudget_s: 600 };

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

export const angleSourcesBench: BenchSection = {
  name: 'angle sources: 1 s of the traction demo at 10 kHz, encoder and resolver against the true angle',
  run() {
    const path = fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url));
    const p = loadProjectText(readFileSync(path, 'utf8'));
    const scenario = { duration_s: 1 };
    const setups: [string, SimulationSetup<MachineInput>][] = [
      ['ideal   ', simulationFromProject(p, { control: { fCtrl_Hz: 10000, angle: { source: 'ideal' } }, scenario })],
      ['encoder ', simulationFromProject(p, { control: { fCtrl_Hz: 10000, angle: { source: 'encoder', linesPerRev: 2048, speedWindowPeriods: 4, speedFilter_Hz: 200, offset_deg: 0 } }, scenario })],
      ['resolver', simulationFromProject(p, { control: { fCtrl_Hz: 10000, angle: { source: 'resolver', bandwidth_Hz: 300, damping: 0.707, amplitudeImbalance: 0, quadratureError_deg: 0, polePairs: 1 } }, scenario })],
    ];
    const once = (s: SimulationSetup<MachineInput>): { w: number; r: SimulationResult } => {
      const t0 = performance.now();
      const r = runSimulation(s, TIMED);
      return { w: (performance.now() - t0) / 1000, r };
    };
    for (let i = 0; i < 3; i++) for (const [, s] of setups) once(s); // warm-up
    const walls = setups.map(() => [] as number[]);
    const results: SimulationResult[] = [];
    for (let i = 0; i < REPEATS; i++) setups.forEach(([, s], j) => { const o = once(s); walls[j]!.push(o.w); results[j] = o.r; });
    const perPeriod = (j: number, f: (w: number[]) => number): number => f(walls[j]!) / results[j]!.stats.controlSteps;
    setups.forEach(([name], j) => {
      const r = results[j]!;
      console.log(`${name}: fastest ${(Math.min(...walls[j]!) * 1e3).toFixed(1)} ms, median ${(median(walls[j]!) * 1e3).toFixed(1)} ms of ${REPEATS}, ${(perPeriod(j, (w) => Math.min(...w)) * 1e9).toFixed(0)} ns per control period, ${(r.stats.rhsEvaluations / r.stats.controlSteps).toFixed(2)} evaluations per period` +
        (j > 0 ? `; ratio to ideal ${(perPeriod(j, (w) => Math.min(...w)) / perPeriod(0, (w) => Math.min(...w))).toFixed(3)} (fastest), ${(perPeriod(j, median) / perPeriod(0, median)).toFixed(3)} (median); angle error rms ${r.metrics.angleErrorRms_rad?.toExponential(2)} rad, final speed ${r.metrics.finalSpeed_rpm?.toFixed(1)} rpm` : ''));
    });
    console.log('target: encoder and resolver <= 1.25 x ideal per control period');
  },
};

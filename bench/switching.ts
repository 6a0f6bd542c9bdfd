/**
 * Switching-model bench: one second of the traction demo (its speed step plus load step) at 10 kHz
 * control with a 10 kHz carrier (one update per period, min-max SVPWM, dead time 2 µs), against the
 * averaged model in the same process: alternating runs so that load from other processes falls on
 * both alike, the fastest and the median of each, and the process's CPU time per run (median and
 * range: less sensitive to other processes than the wall clock). Target (issue 14): the switching
 * model at least 50x real time.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import type { SimulationResult, SimulationSetup } from '../src/core/simulation/simulate';
import type { MachineInput } from '../src/core/machine/machine-model';
import type { BenchSection } from './index';

const REPEATS = 15;
const TIMED = { wallBudget_s: 600 };

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

export const switchingBench: BenchSection = {
  name: 'switching model: 1 s at a 10 kHz carrier, traction demo, against the averaged model',
  run() {
    const path = fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url));
    const p = loadProjectText(readFileSync(path, 'utf8'));
    const scenario = { duration_s: 1 };
    const avg = simulationFromProject(p, { control: { fCtrl_Hz: 10000 }, scenario });
    const sw = simulationFromProject(p, { control: { fCtrl_Hz: 10000, pwm: { model: 'switching', fsw_Hz: 10000, deadTime_s: 2e-6 } }, scenario });
    const once = (s: SimulationSetup<MachineInput>): { w: number; c: number; r: SimulationResult } => {
      const c0 = process.cpuUsage();
      const t0 = performance.now();
      const r = runSimulation(s, TIMED);
      const w = (performance.now() - t0) / 1000;
      const c = process.cpuUsage(c0);
      return { w, c: (c.user + c.system) / 1e6, r };
    };
    for (let i = 0; i < 3; i++) { once(avg); once(sw); } // warm-up
    const wa: number[] = [], ws: number[] = [], ca: number[] = [], cs: number[] = [];
    let ra!: SimulationResult, rs!: SimulationResult;
    for (let i = 0; i < REPEATS; i++) {
      const a = once(avg); wa.push(a.w); ca.push(a.c); ra = a.r;
      const b = once(sw); ws.push(b.w); cs.push(b.c); rs = b.r;
    }
    const sim = (r: SimulationResult): number => r.stats.controlSteps * avg.controller.Ts;
    const line = (name: string, w: number[], r: SimulationResult): string =>
      `${name}: fastest ${(Math.min(...w) * 1e3).toFixed(1)} ms, median ${(median(w) * 1e3).toFixed(1)} ms of ${REPEATS} -> ${(sim(r) / Math.min(...w)).toFixed(0)}x real time (median ${(sim(r) / median(w)).toFixed(0)}x), ${(r.stats.rhsEvaluations / r.stats.controlSteps).toFixed(1)} evaluations per period`;
    // CPU time of the process per run (user + system; other processes' load does not count, the collector's does)
    const cpu = (name: string, c: number[], r: SimulationResult): string =>
      `${name}: CPU median ${(median(c) * 1e3).toFixed(1)} ms (range ${(Math.min(...c) * 1e3).toFixed(1)} to ${(Math.max(...c) * 1e3).toFixed(1)}) -> ${(sim(r) / median(c)).toFixed(0)}x real time per CPU second`;
    console.log(line('averaged model ', wa, ra));
    console.log(line('switching model', ws, rs));
    console.log(`  wall range: averaged ${(Math.min(...wa) * 1e3).toFixed(1)} to ${(Math.max(...wa) * 1e3).toFixed(1)} ms, switching ${(Math.min(...ws) * 1e3).toFixed(1)} to ${(Math.max(...ws) * 1e3).toFixed(1)} ms`);
    console.log(cpu('averaged model  ', ca, ra));
    console.log(cpu('switching model ', cs, rs));
    console.log(`  ratio switching / averaged, CPU median: ${(median(cs) / median(ca)).toFixed(2)}`);
    console.log(`  ratio switching / averaged: ${(Math.min(...ws) / Math.min(...wa)).toFixed(2)} (fastest), ${(median(ws) / median(wa)).toFixed(2)} (median)`);
    console.log(`  final speed ${rs.metrics.finalSpeed_rpm?.toFixed(2)} rpm (averaged ${ra.metrics.finalSpeed_rpm?.toFixed(2)}), rms current ${rs.metrics.rmsCurrent_A?.toFixed(2)} A (averaged ${ra.metrics.rmsCurrent_A?.toFixed(2)})`);
    console.log('target: switching model >= 50x real time');
  },
};

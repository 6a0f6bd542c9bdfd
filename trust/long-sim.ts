/**
 * One long simulation in its own process, so that its resident memory is its own: the 48 V demo
 * motor (invented data) at 20 kHz control for 60 s of simulated time, with speed and load steps.
 * The resident set size is sampled at every progress report (every 256 control periods) and
 * printed as one JSON line: { periods, simulated_s, wall_s, rssBefore_MB, rssPeak_MB, traceLength, maxPoints, diagnostic }.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { DEFAULT_MAX_POINTS } from '../src/core/simulation/decimate';

export const LONG_SIM = { duration_s: 60, fCtrl_Hz: 20000 } as const;

const root = join(import.meta.dirname, '..');
const j = JSON.parse(readFileSync(join(root, 'resources', 'demo-spm-48v.json'), 'utf8'));
j.control = { ...j.control, fCtrl_Hz: LONG_SIM.fCtrl_Hz };
j.scenario = {
  ...j.scenario,
  duration_s: LONG_SIM.duration_s,
  speedSteps: [{ t_s: 0.01, speed_rpm: 3000 }, { t_s: 20, speed_rpm: 1500 }, { t_s: 40, speed_rpm: 4000 }],
  loadSteps: [{ t_s: 10, torque_Nm: 6 }, { t_s: 30, torque_Nm: 2 }, { t_s: 50, torque_Nm: 5 }],
};
const setup = simulationFromProject(resolveProject(parseProject(j)));
const mb = (b: number): number => Math.round((b / 2 ** 20) * 10) / 10;
const rssBefore = process.memoryUsage().rss;
let peak = rssBefore;
const t0 = performance.now();
const r = runSimulation(setup, {
  wallBudget_s: 1800,
  onProgress: () => {
    const rss = process.memoryUsage().rss;
    if (rss > peak) peak = rss;
  },
});
const wall = (performance.now() - t0) / 1000;
peak = Math.max(peak, process.memoryUsage().rss);
process.stdout.write(JSON.stringify({
  periods: r.stats.controlSteps,
  simulated_s: r.stats.controlSteps / LONG_SIM.fCtrl_Hz,
  wall_s: Math.round(wall * 10) / 10,
  rssBefore_MB: mb(rssBefore),
  rssPeak_MB: mb(peak),
  traceLength: r.traces.t_s.length,
  maxPoints: DEFAULT_MAX_POINTS,
  diagnostic: r.diagnostic ?? null,
}) + '\n');

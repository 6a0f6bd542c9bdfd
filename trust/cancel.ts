/**
 * Cancel latency of one run, in a fresh process (as a worker that runs one simulation): the 48 V
 * demo (invented data) at 20 kHz control set to the longest scenario the simulator accepts
 * (MAX_CONTROL_PERIODS control periods, 100 s simulated), so that the run is still going when the
 * signal is raised even on a fast machine, and an abort signal whose `aborted` turns true
 * AFTER_MS after the start, and the wall time from that moment to runSimulation returning.
 * Usage: tsx trust/cancel.ts AFTER_MS [REPEATS]. Prints one JSON line per run:
 * { after_ms, latency_ms, periods, aborted }. With REPEATS > 1 the runs follow each other in the
 * same process (the garbage of the previous run is still there).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { resolveProject } from '../src/core/project/project';
import { parseProject } from '../src/core/project/schema';
import { runSimulation, MAX_CONTROL_PERIODS } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';

const root = join(import.meta.dirname, '..');
const now = (): number => performance.now();
const j = JSON.parse(readFileSync(join(root, 'resources', 'demo-spm-48v.json'), 'utf8'));
const F_CTRL = 20000;
j.control = { ...j.control, fCtrl_Hz: F_CTRL };
j.scenario = { ...j.scenario, duration_s: MAX_CONTROL_PERIODS / F_CTRL };
const setup = simulationFromProject(resolveProject(parseProject(j)));
const after = Number(process.argv[2] ?? 100);
const repeats = Math.max(1, Math.min(50, Number(process.argv[3] ?? 1)));
for (let k = 0; k < repeats; k++) {
  const flip = now() + after;
  const signal = { get aborted(): boolean { return now() >= flip; } };
  const r = runSimulation(setup, { signal });
  const latency = now() - flip;
  process.stdout.write(JSON.stringify({ after_ms: after, latency_ms: Math.round(latency * 10) / 10, periods: r.stats.controlSteps, aborted: r.events.some((e) => e.kind === 'aborted') }) + '\n');
}

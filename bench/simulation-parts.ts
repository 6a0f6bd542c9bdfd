/**
 * The parts of a simulated control period, timed apart in one engine (a checkout's src, given as
 * root): the controller's sampled step, the trace recorder with its decimator (the default 5000
 * points), and building the reference table (the first build in the process, then warm). The states
 * fed to the controller and the recorder are those of a full-rate run of the demo, so every branch
 * the run takes is taken. Used by against-checkout.ts (`--child-parts`), one process per measurement.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

export interface PartsTiming {
  /** ns per control period, median of rounds */
  controller_ns: number;
  recorder_ns: number;
  /** the first reference-table build in the process, and the median of later ones, ms */
  tableCold_ms: number;
  tableWarm_ms: number;
}

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
type Any = any; // eslint-disable-line @typescript-eslint/no-explicit-any

export async function partsTiming(root: string, demo: string): Promise<PartsTiming> {
  const imp = async (p: string): Promise<Any> => import(pathToFileURL(join(root, p)).href);
  const project = await imp('src/core/project/project.ts');
  const fromProject = await imp('src/core/project/simulation-from-project.ts');
  const control = await imp('src/core/control/controller.ts');
  const table = await imp('src/core/control/reference-table.ts');
  const simulate = await imp('src/core/simulation/simulate.ts');
  const plantMod = await imp('src/core/simulation/plant.ts');
  const recorder = await imp('src/core/simulation/recorder.ts');
  const p = project.loadProjectText(readFileSync(join(root, 'resources', `${demo}.json`), 'utf8'));
  // the table first: its cold build is the one a command-line run pays
  const s0 = fromProject.simulationFromProject(p);
  const tab = s0.controller.table;
  const tableArgs = tab ? { speedMax_rad_s: tab.speedMax, speedNodes: tab.nS, torqueNodes: tab.nU } : null;
  const buildTable = (): number => { const t0 = performance.now(); table.buildReferenceTable(p.models.hot, p.peak, tableArgs); return performance.now() - t0; };
  // cold: in a fresh child the simulationFromProject above already built one; time that separately below
  const tw: number[] = [];
  for (let i = 0; i < (tableArgs ? 7 : 0); i++) tw.push(buildTable());
  const s = s0;
  const Ts = s.controller.Ts;
  const run = simulate.runSimulation(s, { maxPoints: 200000, wallBudget_s: 600 });
  const tr = run.traces;
  const n = tr.t_s.length - 1;
  const pp = s.plant.machine.polePairs ?? p.models.hot.polePairs;
  // state per period: id, iq, omega, theta (theta integrated from the speed), cos, sin
  const st = new Float64Array(6 * n);
  let th = s.initialTheta_rad;
  for (let k = 0; k < n; k++) {
    const w = tr.speed_rpm[k]! * Math.PI / 30;
    st[6 * k] = tr.id_A[k]!; st[6 * k + 1] = tr.iq_A[k]!; st[6 * k + 2] = w; st[6 * k + 3] = th;
    st[6 * k + 4] = Math.cos(th); st[6 * k + 5] = Math.sin(th);
    th = (th + pp * w * Ts) % (2 * Math.PI);
  }
  const out = new Float64Array(2);
  const ctrlRun = (): number => {
    const c = new control.CascadeController(s.controller);
    c.reset(st[2]!, st[3]!);
    const smp = c.sample;
    const t0 = performance.now();
    for (let k = 0; k < n; k++) {
      const b = 6 * k;
      smp[0] = k * Ts; smp[1] = st[b]!; smp[2] = st[b + 1]!; smp[3] = st[b + 2]!; smp[4] = st[b + 3]!; smp[5] = st[b + 4]!; smp[6] = st[b + 5]!;
      c.stepSampled(out);
    }
    return ((performance.now() - t0) * 1e6) / n;
  };
  const recRun = (): number => {
    const plant = new plantMod.Plant(s.plant);
    const c = new control.CascadeController(s.controller);
    c.reset(st[2]!, st[3]!);
    const rec = new recorder.TraceRecorder(s, plant.model, plant, c, n, 5000);
    const y = new Float64Array(plantMod.STATE_SIZE);
    plant.input[0] = 10; plant.input[1] = -5;
    const t0 = performance.now();
    for (let k = 0; k < n; k++) {
      const b = 6 * k;
      y[0] = st[b]!; y[1] = st[b + 1]!; y[2] = st[b + 2]!; y[3] = st[b + 3]!;
      plant.setAngleOrigin(st[b + 3]!);
      rec.record(k, y);
    }
    rec.traces();
    return ((performance.now() - t0) * 1e6) / n;
  };
  const tc: number[] = [], trr: number[] = [];
  for (let i = 0; i < 25; i++) { tc.push(ctrlRun()); trr.push(recRun()); }
  return { controller_ns: median(tc.slice(5)), recorder_ns: median(trr.slice(5)), tableCold_ms: NaN, tableWarm_ms: tw.length ? median(tw) : NaN };
}

/** In a fresh child: the cold table build alone (the first in the process), ms. */
export async function tableColdTiming(root: string, demo: string): Promise<number> {
  const imp = async (p: string): Promise<Any> => import(pathToFileURL(join(root, p)).href);
  const project = await imp('src/core/project/project.ts');
  const table = await imp('src/core/control/reference-table.ts');
  const p = project.loadProjectText(readFileSync(join(root, 'resources', `${demo}.json`), 'utf8'));
  const m = p.models.hot;
  const lim = p.peak;
  // the simulation's own grid (simulation-from-project.ts): up to 1.2 x the no-load speed at least
  const speedMax = 1.2 * lim.Vmax / (m.polePairs * m.psiM);
  const t0 = performance.now();
  table.buildReferenceTable(m, lim, { speedMax_rad_s: speedMax });
  return performance.now() - t0;
}

/**
 * Sensorless estimator bench: the cost per control period of the wired simulator with the
 * sensorless estimator (active-flux observer, PLL, start-up, lock watchdog, angle-error traces)
 * against the same run with the true angle, on the 48 V demo's own scenario (standstill to
 * 3000 rpm, load step; 20 kHz control, averaged inverter), runs alternating in one process so that
 * load from other processes falls on both alike; fastest and median of each, the machine's load
 * average printed beside them. Also the estimator's step alone on precomputed inputs (traction
 * demo at 3000 rpm) as a fraction of the ideal period. Target (issue 15): at most +60 %.
 */
import { readFileSync } from 'node:fs';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import type { SimulationSetup } from '../src/core/simulation/simulate';
import type { MachineInput } from '../src/core/machine/machine-model';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { SensorlessEstimator } from '../src/core/control/sensorless-estimator';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { BenchSection } from './index';

const REPEATS = 11;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

/** the wired simulator: the 48 V demo sensorless against the same with the true angle, per control period */
function wired(): void {
  const path = fileURLToPath(new URL('../resources/demo-spm-48v.json', import.meta.url));
  const p = loadProjectText(readFileSync(path, 'utf8'));
  const setups: [string, SimulationSetup<MachineInput>][] = [
    ['ideal     ', simulationFromProject(p, { control: { angle: { source: 'ideal' } } })],
    ['sensorless', simulationFromProject(p)],
  ];
  const once = (s: SimulationSetup<MachineInput>): { w: number; n: number; diag: string | undefined } => {
    const t0 = performance.now();
    const r = runSimulation(s, { wallBudget_s: 600 });
    return { w: (performance.now() - t0) / 1000, n: r.stats.controlSteps, diag: r.diagnostic };
  };
  for (let i = 0; i < 3; i++) for (const [, s] of setups) once(s); // warm-up
  const walls = setups.map(() => [] as number[]);
  const n = setups.map(() => 1);
  for (let i = 0; i < REPEATS; i++) setups.forEach(([, s], j) => { const o = once(s); walls[j]!.push(o.w); n[j] = o.n; if (o.diag) console.log(`  ${setups[j]![0].trim()}: ${o.diag}`); });
  const per = (j: number, f: (w: number[]) => number): number => f(walls[j]!) / n[j]!;
  setups.forEach(([name], j) => console.log(`${name}: fastest ${(per(j, (w) => Math.min(...w)) * 1e9).toFixed(0)} ns, median ${(per(j, median) * 1e9).toFixed(0)} ns per control period (${n[j]} periods, ${REPEATS} runs alternating)`));
  const rf = per(1, (w) => Math.min(...w)) / per(0, (w) => Math.min(...w)), rm = per(1, median) / per(0, median);
  console.log(`  wired simulator, sensorless / ideal per control period: ${rf.toFixed(3)} (fastest), ${rm.toFixed(3)} (median); target at most 1.60; load average ${loadavg().map((x) => x.toFixed(2)).join(' ')}`);
}

export const sensorlessBench: BenchSection = {
  name: 'sensorless estimator: cost per control period against the true angle, wired simulator (48 V demo) and the step alone (traction demo)',
  run() {
    wired();
    const path = fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url));
    const p = loadProjectText(readFileSync(path, 'utf8'));
    const setup = simulationFromProject(p, { control: { fCtrl_Hz: 10000 }, scenario: { duration_s: 1 } });
    const Ts = setup.controller.Ts;
    // the ideal-angle period: a whole simulated period (plant, controller, traces)
    const simOnce = (): { w: number; n: number } => {
      const t0 = performance.now();
      const r = runSimulation(setup, { wallBudget_s: 600 });
      return { w: (performance.now() - t0) / 1000, n: r.stats.controlSteps };
    };
    // the estimator on a steady state of the same machine at 3000 rpm with rated current (inputs precomputed)
    const m = p.models.hot as DqMachine;
    const N = 10000;
    const ia = new Float64Array(N), ib = new Float64Array(N), va = new Float64Array(N), vb = new Float64Array(N), th = new Float64Array(N);
    const we = (3000 * 2 * Math.PI / 60) * m.polePairs, id = -100, iq = 180;
    const vd = m.Rs * id - we * m.Lq * iq, vq = m.Rs * iq + we * (m.Ld * id + m.psiM);
    for (let k = 0; k < N; k++) {
      const t = k * Ts, a = we * t, c = Math.cos(a), s = Math.sin(a), am = we * (t - Ts / 2), cm = Math.cos(am), sm = Math.sin(am);
      th[k] = a; ia[k] = c * id - s * iq; ib[k] = s * id + c * iq; va[k] = cm * vd - sm * vq; vb[k] = sm * vd + cm * vq;
    }
    const est = new SensorlessEstimator({ source: 'sensorless', bandwidth_Hz: 100, handoverSpeed_rpm: 300, fluxError_pct: 0, resistanceError_pct: 0, inductanceError_pct: 0 }, m, { startupCurrent_A: 100 });
    let sink = 0;
    const estOnce = (): number => {
      est.reset(0, we);
      let acc = 0;
      const t0 = performance.now();
      const x = est.input;
      for (let k = 0; k < N; k++) {
        x[0] = th[k]!; x[1] = 0; x[2] = ia[k]!; x[3] = ib[k]!; x[4] = va[k]!; x[5] = vb[k]!; x[6] = Ts;
        est.sampleFromInput();
        acc += est.thetaE;
      }
      const dt = (performance.now() - t0) / 1000 / N;
      sink += acc;
      return dt;
    };
    for (let i = 0; i < 3; i++) { simOnce(); estOnce(); } // warm-up
    const ws: number[] = [], we_: number[] = [];
    let n = 1;
    for (let i = 0; i < REPEATS; i++) {
      const s = simOnce(); ws.push(s.w); n = s.n;
      we_.push(estOnce());
    }
    const period = Math.min(...ws) / n, periodMed = median(ws) / n;
    const estP = Math.min(...we_), estMed = median(we_);
    console.log(`ideal-angle period (simulator, 1 s at 10 kHz): fastest ${(period * 1e9).toFixed(0)} ns, median ${(periodMed * 1e9).toFixed(0)} ns`);
    console.log(`sensorless estimator step: fastest ${(estP * 1e9).toFixed(0)} ns, median ${(estMed * 1e9).toFixed(0)} ns${Number.isFinite(sink) ? '' : ' (diverged)'}`);
    console.log(`  the estimator's step alone, added cost per control period: +${((estP / period) * 100).toFixed(1)} % (fastest), +${((estMed / periodMed) * 100).toFixed(1)} % (median); target at most +60 %`);
  },
};

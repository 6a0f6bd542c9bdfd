/**
 * Sensorless estimator bench: the cost of the observer's step per control period (active-flux
 * observer, PLL, start-up and lock bookkeeping) against the cost of a control period with the ideal
 * angle (the whole simulator period: plant integration, controller, recording), both on the
 * traction demo at 10 kHz, in the same process. The simulator's wiring of the estimator is not
 * timed here (another change owns it): the figure is the estimator's added cost as a fraction of
 * an ideal-angle period. Target (issue 15): at most +60 %.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { SensorlessEstimator } from '../src/core/control/sensorless-estimator';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { BenchSection } from './index';

const REPEATS = 9;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

export const sensorlessBench: BenchSection = {
  name: 'sensorless estimator: cost per control period against an ideal-angle period, traction demo',
  run() {
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
    console.log(`  added cost per control period: +${((estP / period) * 100).toFixed(1)} % (fastest), +${((estMed / periodMed) * 100).toFixed(1)} % (median); target at most +60 %`);
  },
};

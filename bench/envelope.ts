/**
 * Envelope bench: a 400-point motoring envelope with Rs on the interior-magnet traction demo (hot
 * corner), our solver against a brute-force (id, iq) grid search tuned to 0.1 % torque accuracy
 * (far coarser than ours, so the ratio understates the gain). Medians of repeated runs, same process
 * (a grid run over 2 s is timed once, and says so).
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { DqMachine } from '../src/core/machine/dq-machine';
import type { DriveLimits } from '../src/core/drive/inverter-spec';
import { computeEnvelope, ENVELOPE_ACCURACY, type Envelope } from '../src/core/steady-state/envelope';
import { loadProjectText } from '../src/core/project/project';
import type { BenchSection } from './index';

const POINTS = 400;
const GRID_ACCURACY = 1e-3;

function demo(): { m: DqMachine; lim: DriveLimits; label: string } {
  try {
    const path = fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url));
    const p = loadProjectText(readFileSync(path, 'utf8'));
    return { m: p.hot, lim: p.peak, label: `${p.name} (hot corner)` };
  } catch (e) {
    // invented fallback values until the demo file loads
    return {
      m: { polePairs: 4, Rs: 0.02, Ld: 0.12e-3, Lq: 0.3e-3, psiM: 0.045 },
      lim: { Vmax: 350 / Math.sqrt(3), Imax: 400 },
      label: `invented IPM (demo file not loaded: ${e instanceof Error ? e.message : String(e)})`,
    };
  }
}

/** Brute force: best feasible torque over an n x 2n (id, iq) grid of the motoring half disc, per speed. */
function gridEnvelope(m: DqMachine, lim: DriveLimits, speeds: Float64Array, n: number, out: Float64Array): void {
  const { polePairs: p, Rs, Ld, Lq, psiM } = m;
  const I = lim.Imax, I2 = I * I, V2 = lim.Vmax * lim.Vmax;
  for (let k = 0; k < speeds.length; k++) {
    const we = p * speeds[k];
    let best = 0;
    for (let a = 0; a <= 2 * n; a++) {
      const id = -I + (I * a) / n;
      for (let b = 0; b <= n; b++) {
        const iq = (I * b) / n;
        if (id * id + iq * iq > I2) continue;
        const vd = Rs * id - we * Lq * iq;
        const vq = Rs * iq + we * (Ld * id + psiM);
        if (vd * vd + vq * vq > V2) continue;
        const T = 1.5 * p * iq * (psiM + (Ld - Lq) * id);
        if (T > best) best = T;
      }
    }
    out[k] = best;
  }
}

function maxRelError(ref: Envelope, got: Float64Array, stride: number): number {
  let e = 0;
  for (let k = 0, j = 0; k < ref.speed.length; k += stride, j++) {
    if (!ref.feasible[k] || !(ref.torque[k] > 0)) continue;
    e = Math.max(e, Math.abs(got[j] - ref.torque[k]) / ref.torque[k]);
  }
  return e;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time(f: () => void, runs: number): number {
  const t: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    f();
    t.push(performance.now() - t0);
  }
  return median(t);
}

export const envelopeBench: BenchSection = {
  name: `envelope, ${POINTS} points, Rs included`,
  run() {
    const { m, lim, label } = demo();
    console.log(`machine: ${label}`);
    console.log(`  p=${m.polePairs} Rs=${m.Rs.toPrecision(4)} ohm Ld=${(m.Ld * 1e3).toPrecision(4)} mH Lq=${(m.Lq * 1e3).toPrecision(4)} mH psiM=${m.psiM.toPrecision(4)} Wb; Vmax=${lim.Vmax.toFixed(1)} V peak, Imax=${lim.Imax.toFixed(1)} A peak`);
    const opts = { points: POINTS };
    const ref = computeEnvelope(m, lim, opts);
    const regions = new Set(ref.region);
    console.log(`  speed 0..${(ref.speed[POINTS - 1] * 30 / Math.PI).toFixed(0)} rpm, regions: ${[...regions].join(', ')}`);

    // tune the grid on every 8th speed until it reaches GRID_ACCURACY against our envelope
    const stride = 8;
    const sub = new Float64Array(Math.ceil(POINTS / stride));
    for (let k = 0, j = 0; k < POINTS; k += stride, j++) sub[j] = ref.speed[k];
    const subOut = new Float64Array(sub.length);
    let n = 50;
    let err = Infinity;
    let tuned = false;
    for (;;) {
      gridEnvelope(m, lim, sub, n, subOut);
      err = maxRelError(ref, subOut, stride);
      if (err <= GRID_ACCURACY) { tuned = true; break; }
      if (n >= 6400) break; // the finest grid tried; the bench says the target was not reached
      n *= 2;
    }
    const full = new Float64Array(POINTS);
    // one timed run first; repeat (median of 3) only when a run is short enough to keep the bench brief
    const t0 = performance.now();
    gridEnvelope(m, lim, ref.speed, n, full);
    const tFirst = performance.now() - t0;
    const gridRuns = tFirst > 2000 ? 1 : 3;
    const tGrid = gridRuns === 1 ? tFirst : time(() => gridEnvelope(m, lim, ref.speed, n, full), gridRuns);
    const gridErr = maxRelError(ref, full, 1);

    for (let r = 0; r < 50; r++) computeEnvelope(m, lim, opts); // warm-up
    const tOurs = time(() => computeEnvelope(m, lim, opts), 101);

    console.log(`  ours:        median ${tOurs.toFixed(3)} ms per envelope (101 runs), stated accuracy ${ENVELOPE_ACCURACY} relative torque`);
    console.log(`  brute force: ${gridRuns > 1 ? `median of ${gridRuns} runs` : '1 run (too slow to repeat; not a median)'} ${tGrid.toFixed(1)} ms per envelope, (id, iq) grid ${2 * n + 1} x ${n + 1}, max error ${(gridErr * 100).toFixed(3)} % (${tuned ? `tuned to <= ${GRID_ACCURACY * 100} %` : `tuning target ${GRID_ACCURACY * 100} % NOT reached at the finest grid tried`})`);
    const ratio = tGrid / tOurs;
    console.log(`  ratio: ${ratio.toFixed(0)}x faster (target >= 50x: ${ratio >= 50 ? 'met' : 'NOT met'}); under 2 ms: ${tOurs < 2 ? 'met' : 'NOT met'}`);
  },
};

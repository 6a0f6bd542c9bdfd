/**
 * Efficiency-map bench: a 100 x 100 map (0..12000 rpm, -250..250 N·m shaft torque) with least-current
 * control on the interior-magnet traction demo (hot corner) with invented loss data, on one core.
 * Target: under 300 ms. Median of repeated runs after a warm-up, same process.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { loadProjectText } from '../src/core/project/project';
import { efficiencyMap, mapAxis } from '../src/core/steady-state/efficiency-map';
import type { LossConditions } from '../src/core/steady-state/point-losses';
import type { BenchSection } from './index';

const N = 100;
const TARGET_MS = 300;

export const efficiencyMapBench: BenchSection = {
  name: 'efficiency map (100 x 100, traction demo, least current)',
  run() {
    const p = loadProjectText(readFileSync(fileURLToPath(new URL('../resources/demo-ipm-traction.json', import.meta.url)), 'utf8'));
    // invented loss data
    const c: LossConditions = {
      Vdc: p.inverter.Vdc, friction: { B: p.mechanics.viscousFriction, Tc: p.mechanics.coulombFriction },
      losses: {
        iron: { kh: 100, beta: 2, ke: 0.5 }, windage: { kw: 5e-8 },
        inverter: { Vce0: 0.8, rce: 0.002, Vf0: 0.9, rd: 0.0015, EonEoff_J: 0.022, Err_J: 0.006, Vref_V: 300, Iref_A: 200, fsw_Hz: 10000 },
      },
    };
    const S = mapAxis(0, (12000 * Math.PI) / 30, N), T = mapAxis(-250, 250, N);
    const times: number[] = [];
    let inside = 0;
    for (let rep = 0; rep < 6; rep++) {
      const t0 = performance.now();
      const r = efficiencyMap(p.models.hot, p.peak, c, S, T);
      const dt = performance.now() - t0;
      if (rep > 0) times.push(dt);
      inside = r.feasible.reduce((a, b) => a + b, 0);
    }
    times.sort((a, b) => a - b);
    const med = times[Math.floor(times.length / 2)]!;
    console.log(`${N} x ${N} map, ${inside} points inside the envelope: median ${med.toFixed(0)} ms (target < ${TARGET_MS} ms: ${med < TARGET_MS ? 'met' : 'NOT met'})`);
  },
};

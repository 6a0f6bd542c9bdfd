import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { loadProjectText } from '../src/core/project/project';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
import { runSimulation } from '../src/core/simulation/simulate';
import type { SimulationResult } from '../src/core/simulation/simulate';

const demo = (f: string): any => JSON.parse(readFileSync(resolve(__dirname, '..', 'resources', `${f}.json`), 'utf8'));
const strip = (r: SimulationResult): unknown => ({ ...r, stats: { ...r.stats, wall_s: 0, setup_s: 0, run_s: 0 } });

// A run owns its state: one started from another's progress callback (interleaved) gives exactly
// what it gives alone, and so does the run it interrupted. Common practice (no source).
describe('interleaved runs', () => {
  it('two runs, the second inside the first\'s progress callbacks, equal two separate runs', () => {
    const a = simulationFromProject(loadProjectText(JSON.stringify(demo('demo-servo-axis'))), { scenario: { duration_s: 0.1 } });
    const b = simulationFromProject(loadProjectText(JSON.stringify(demo('demo-ipm-traction'))), { scenario: { duration_s: 0.08 }, solver: { method: 'rk4', rk4Substeps: 2 } });
    const aloneA = runSimulation(a, { maxPoints: 500 });
    const aloneB = runSimulation(b, { maxPoints: 500 });
    const inner: SimulationResult[] = [];
    const nested = runSimulation(a, {
      maxPoints: 500,
      onProgress: (x) => { if (x < 1 && inner.length < 3) inner.push(runSimulation(b, { maxPoints: 500 })); },
    });
    expect(inner.length).toBe(3);
    expect(strip(nested)).toEqual(strip(aloneA));
    for (const r of inner) expect(strip(r)).toEqual(strip(aloneB));
    expect(aloneA.stats.controlSteps).toBe(1600); // 0.1 s at 16 kHz
    expect(aloneB.stats.controlSteps).toBe(800);
  });
});

import { readFileSync } from 'node:fs';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
const p = loadProjectText(readFileSync('resources/demo-ipm-traction.json', 'utf8'));
const mk = (solver: object) => simulationFromProject(p, { control: { fCtrl_Hz: 10000, pwm: { model: 'switching', deadTime_s: 2e-6 } }, scenario: { duration_s: 1 }, solver });
const ref = runSimulation(mk({ tol: 1e-10 }), { maxPoints: 200000, wallBudget_s: 600 });
for (const s of [{}, { method: 'rk4' }, { method: 'rk4', rk4Substeps: 2 }]) {
  const r = runSimulation(mk(s), { maxPoints: 200000, wallBudget_s: 600 });
  let e = 0, w = 0;
  for (let i = 0; i < r.traces.t_s.length; i++) { e = Math.max(e, Math.abs(r.traces.id_A[i]! - ref.traces.id_A[i]!), Math.abs(r.traces.iq_A[i]! - ref.traces.iq_A[i]!)); w = Math.max(w, Math.abs(r.traces.speed_rpm[i]! - ref.traces.speed_rpm[i]!)); }
  console.log(JSON.stringify(s), 'max |di| A', e.toExponential(2), 'max |dw| rpm', w.toExponential(2), r.stats.rhsEvaluations / r.stats.controlSteps);
}

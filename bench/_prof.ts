import { readFileSync } from 'node:fs';
import { loadProjectText } from '../src/core/project/project';
import { runSimulation } from '../src/core/simulation/simulate';
import { simulationFromProject } from '../src/core/project/simulation-from-project';
const p = loadProjectText(readFileSync('resources/demo-ipm-traction.json', 'utf8'));
for (const method of ['rk4'] as const) {
const avg = simulationFromProject(p, { control: { fCtrl_Hz: 10000 }, scenario: { duration_s: 1 }, solver: { method } });
const sw = simulationFromProject(p, { control: { fCtrl_Hz: 10000, pwm: { model: 'switching', deadTime_s: 0 } }, scenario: { duration_s: 1 }, solver: { method } });
const wa: number[] = [], ws: number[] = [];
for (let i = 0; i < 30; i++) { let t = performance.now(); runSimulation(avg, { wallBudget_s: 600 }); wa.push(performance.now() - t); t = performance.now(); runSimulation(sw, { wallBudget_s: 600 }); ws.push(performance.now() - t); }
console.log(method, 'avg min', Math.min(...wa).toFixed(1), 'ms; sw min', Math.min(...ws).toFixed(1), 'ms');
}

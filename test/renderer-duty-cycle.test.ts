// The Duty cycle view's data path: the traction demo's own cycle and thermal network evaluated by the
// core, and the figures built from the result: the cycle's instants on the torque-speed plane coloured
// by time with the instants outside the envelope marked, the temperature traces with their limits, the
// energy bars; the drawn instants of a long cycle and the app's default step.
import { describe, expect, it } from 'vitest';
import { project } from './duty-cycle-fixtures';
import { temperatureModelFromProject } from '../src/core/project/temperature-model-from-project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { evaluateDutyCycle, type DutyCycleResult } from '../src/core/simulation/duty-cycle';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { CURVE, type PlotTheme } from '../src/renderer/src/components/plot-style';
import {
  cyclePlaneFigure, defaultStep, envelopeLine, DRAWN_MAX, drawnInstants, ENERGY_BARS, energyFigure, energyValues_kJ, temperatureFigure, temperatureLimits,
} from '../src/renderer/src/views/duty-cycle/duty-cycle-figures';

const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };
const col = CURVE.light;
const th = project.thermal!;
const run = (cycle = project.dutyCycle!, step_s = 0.05): DutyCycleResult =>
  evaluateDutyCycle(cycle, th, temperatureModelFromProject(project), lossConditionsFromProject(project), project.peak, { step_s })!;
const r = run();
const env = {
  motoring: computeEnvelope(project.models.hot, project.peak, { points: 80, direction: 'motoring' }),
  generating: computeEnvelope(project.models.hot, project.peak, { points: 80, direction: 'generating' }),
};
type Tr = { name?: string; x: Array<number | null>; y: Array<number | null>; marker?: { color?: unknown }; line?: { dash?: string } };

describe('the cycle on the torque-speed plane', () => {
  it('draws every instant at its speed and torque, coloured by its time, over the hot peak envelope', () => {
    const f = cyclePlaneFigure(r, env, theme, col);
    const d = f.data as unknown as Tr[];
    const pts = d.find((t) => t.name === 'cycle instants (colour: time)')!;
    expect(pts.x.length).toBe(r.t_s.length);
    for (const k of [0, 100, 1234, r.t_s.length - 1]) {
      expect(pts.x[k]).toBe(r.speed_rpm[k]);
      expect(pts.y[k]).toBe(r.torque_Nm[k]);
      expect((pts.marker!.color as number[])[k]).toBe(r.t_s[k]);
    }
    const e = d.find((t) => t.name === 'peak envelope, hot magnet')!;
    // the motoring branch's first point: the zero-speed torque of the hot peak envelope
    expect(e.y[0]).toBeCloseTo(env.motoring.torque[0]!, 12);
    // the demo's cycle lies within the envelope: nothing marked (common practice (no source): the invented cycle is drivable)
    expect(r.outside.length).toBe(0);
    expect(d.some((t) => t.name?.startsWith('outside'))).toBe(false);
  });

  it('marks each instant outside the envelope, and only those', () => {
    const T0 = env.motoring.torque[0]!;
    // a cycle asking 1.3 times the peak torque at standstill for a while: outside (current limit)
    const cycle = { label: 'overload', t_s: Float64Array.from([0, 2, 4, 10]), speed_rpm: Float64Array.from([0, 0, 0, 0]), torque_Nm: Float64Array.from([0, 1.3 * T0, 1.3 * T0, 0]) };
    const o = run(cycle, 0.1);
    let n = 0;
    for (let k = 0; k < o.t_s.length; k++) if (o.traces.outside[k] !== 0) n++;
    expect(n).toBeGreaterThan(10);
    const marked = (cyclePlaneFigure(o, env, theme, col).data as unknown as Tr[]).find((t) => t.name?.startsWith('outside the envelope'))!;
    expect(marked.x.length).toBe(n);
    // every marked instant lies on the overload, near or above the hot peak torque (the magnet, hotter than
    // the hot corner after the overload, lowers the envelope a little): common practice (no source)
    for (const y of marked.y) expect(y!).toBeGreaterThan(0.9 * T0);
    for (let k = 0; k < o.t_s.length; k++) if (o.torque_Nm[k]! < 0.5 * T0) expect(o.traces.outside[k]).toBe(0);
  });
});

describe('the envelope under a reversing cycle', () => {
  it('is reflected through the origin for negative speeds, only when the cycle reverses', () => {
    const fwd = envelopeLine(env.motoring, env.generating);
    const both = envelopeLine(env.motoring, env.generating, true);
    expect(both.x.length).toBe(2 * fwd.x.length + 1);
    const n = fwd.x.length + 1;
    // reverse motoring: the forward motoring torque with both signs turned (from memory: four-quadrant symmetry of a PMSM drive)
    expect(both.x[n]).toBe(-fwd.x[0]!);
    expect(both.y[n]).toBe(-fwd.y[0]!);
    expect(both.y[n + 10]).toBe(-fwd.y[10]!);
    const d = cyclePlaneFigure(r, env, theme, col).data as unknown as Tr[];
    expect(d[0]!.x.length).toBe(fwd.x.length); // the traction demo's cycle never reverses
  });
});

describe('the temperature figure', () => {
  it('draws the four traces, each limit dashed at its value, the coolant dotted', () => {
    const d = temperatureFigure(r, th, theme, col).data as unknown as Tr[];
    const w = d.find((t) => t.name === 'winding')!;
    expect(w.x.length).toBe(r.t_s.length);
    expect(Math.max(...(w.y as number[]))).toBe(r.peaks.winding.value);
    expect(d.find((t) => t.name === 'inverter junction')!.y[0]).toBe(r.junction_C[0]);
    const limits = d.filter((t) => t.line?.dash === 'dash');
    expect(limits.map((t) => t.y[0])).toEqual(temperatureLimits(th).map((l) => l.max_C));
    expect(limits.map((t) => t.y[0])).toEqual([th.windingMax_C, th.magnetMax_C, th.junctionMax_C]);
    expect(d.find((t) => t.line?.dash === 'dot')!.y).toEqual([th.coolantTemp_C, th.coolantTemp_C]);
    // a periodic state: the end temperatures within 0.1 K of the start (the core's stopping rule)
    expect(Math.abs(r.traces.winding_C[r.t_s.length - 1]! - r.start_C[0])).toBeLessThan(0.1);
  });

  it('leaves the junction out when the inverter is not rated', () => {
    const { junctionToCoolant_K_per_W: _a, junctionMax_C: _b, ...unrated } = th;
    const d = temperatureFigure(r, unrated, theme, col).data as unknown as Tr[];
    expect(d.some((t) => t.name?.includes('junction'))).toBe(false);
    expect(temperatureLimits(unrated).length).toBe(2);
  });
});

describe('the energy bars', () => {
  it('DC-link energy in equals shaft energy out plus the losses, kJ, to 1e-6', () => {
    const y = energyValues_kJ(r);
    expect(y.length).toBe(ENERGY_BARS.length);
    // conservation of energy over the cycle (common practice (no source))
    expect(Math.abs(y[0]! - (y[1]! + y[2]! + y[3]! + y[4]! + y[5]!))).toBeLessThan(1e-6 * Math.abs(y[0]!));
    expect(y[0]).toBeCloseTo(r.energies.dcLink_J / 1000, 12);
    expect((energyFigure(r, theme, col).data[0] as unknown as Tr).y).toEqual(y);
  });
});

describe('drawn instants and the default step', () => {
  it('draws every instant of a short cycle and a stride of a long one that keeps its peak and its end', () => {
    expect(drawnInstants(5)).toEqual([0, 1, 2, 3, 4]);
    const n = 10_001;
    const v = Float64Array.from({ length: n }, (_, k) => (k === 4567 ? 99 : Math.sin(k / 100)));
    const idx = drawnInstants(n, v);
    expect(idx.length).toBeLessThanOrEqual(DRAWN_MAX + 1);
    expect(idx).toContain(4567);
    expect(idx[idx.length - 1]).toBe(n - 1);
    for (let k = 1; k < idx.length; k++) expect(idx[k]!).toBeGreaterThan(idx[k - 1]!);
  });

  it('steps about a 2000th of the period, rounded down to 1, 2 or 5 times a power of ten', () => {
    expect(defaultStep(120)).toBe(0.05);
    expect(defaultStep(60)).toBe(0.02);
    expect(defaultStep(2)).toBe(0.001);
    expect(defaultStep(1800)).toBe(0.5);
  });
});

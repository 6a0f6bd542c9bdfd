// The efficiency view's data path: a small map solved by the core, the contour figure built from it
// (efficiency in %, null outside the envelope, axes with units, colour bar in %, envelope and
// requirements drawn), and the loss bar of one point from the core's loss point.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { lossConditionsFromProject } from '../src/core/project/loss-conditions-from-project';
import { solveLossPoint } from '../src/core/steady-state/loss-point';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import { efficiencyGridAxes, emptyEfficiencyMap, solveEfficiencyRow } from '../src/core/reports/efficiency-map-grid';
import { CONTOUR_FROM, efficiencyFigure, lossBarFigure, lossSavedFigure, lossSavedGrid, niceStep, percentGrid } from '../src/renderer/src/views/efficiency/efficiency-figures';
import { minLossGainMap } from '../src/core/steady-state/min-loss-gain-map';
import { CURVE, type PlotTheme } from '../src/renderer/src/components/plot-style';

const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };
const p = loadProjectText(readFileSync(join(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
const { speeds, torques } = efficiencyGridAxes({ corner: 'hot', points: 20, speedMax: 1300, torqueMax: 250 });
const map = emptyEfficiencyMap(speeds, torques);
for (let i = 0; i < speeds.length; i++) solveEfficiencyRow(p, 'hot', map, i);
const env = {
  motoring: computeEnvelope(p.models.hot, p.peak, { points: 50, speedMax: 1300, direction: 'motoring' }),
  generating: computeEnvelope(p.models.hot, p.peak, { points: 50, speedMax: 1300, direction: 'generating' }),
  corner: 'hot',
};

describe('efficiency figure', () => {
  it('z is the map in %, rows by torque and columns by speed, null outside the envelope', () => {
    const z = percentGrid(map, 'system');
    expect(z.length).toBe(20);
    expect(z[0]!.length).toBe(20);
    let nulls = 0;
    for (let j = 0; j < 20; j++)
      for (let i = 0; i < 20; i++) {
        const k = i * 20 + j;
        if (map.feasible[k]) expect(z[j]![i]).toBeCloseTo(100 * map.system[k]!, 12);
        else {
          expect(z[j]![i]).toBeNull();
          nulls++;
        }
      }
    expect(nulls).toBeGreaterThan(0);
  });

  it('contours in %, axes and colour bar labelled with units, envelope and requirements drawn', () => {
    const reqs = p.requirements.map((r) => ({ label: r.label, speed_rpm: r.speed_rpm, torque_Nm: r.torque_Nm }));
    const f = efficiencyFigure(map, 'motor', env, reqs, theme, CURVE.light);
    const c = f.data[0] as unknown as { type: string; z: Array<Array<number | null>>; contours: { start: number; end: number; size: number; showlabels: boolean }; colorbar: { title: { text: string }; ticksuffix: string }; x: number[] };
    expect(c.type).toBe('contour');
    expect(c.contours.start).toBe(CONTOUR_FROM);
    expect(c.contours.end).toBe(100);
    expect(c.contours.showlabels).toBe(true);
    expect(c.colorbar.title.text).toBe('motor efficiency, %');
    expect(c.colorbar.ticksuffix).toBe(' %');
    // speeds in rpm: 1300 rad/s = 12414 rpm (60 / 2π)
    expect(c.x[19]).toBeCloseTo(12414.08, 1);
    const zmax = Math.max(...c.z.flat().filter((v): v is number => v !== null));
    expect(zmax).toBeGreaterThan(80);
    expect(zmax).toBeLessThan(100);
    const names = f.data.map((d) => (d as { name?: string }).name);
    expect(names).toContain('peak envelope, hot magnet');
    expect(names).toContain('requirements');
    const reqTrace = f.data.find((d) => (d as { name?: string }).name === 'requirements') as { x: number[] };
    expect(reqTrace.x.length).toBe(p.requirements.length);
    const lay = f.layout as unknown as { xaxis: { title: { text: string } }; yaxis: { title: { text: string } }; paper_bgcolor: string };
    expect(lay.xaxis.title.text).toBe('speed (rpm)');
    expect(lay.yaxis.title.text).toMatch(/^shaft torque \(N·m\)/);
    expect(lay.paper_bgcolor).toBe(theme.panel);
  });

  it('the loss bar shows the core loss point: copper, iron, mechanical, inverter in W', () => {
    const pt = solveLossPoint(p.models.hot, p.peak, lossConditionsFromProject(p), 500, 100);
    expect(pt.feasible).toBe(true);
    const f = lossBarFigure(pt, theme, CURVE.light);
    const b = f.data[0] as unknown as { x: string[]; y: number[] };
    expect(b.x).toEqual(['copper', 'iron', 'mechanical', 'inverter']);
    expect(b.y).toEqual([pt.losses.copper_W, pt.losses.iron_W, pt.losses.mechanical_W, pt.losses.inverter_W]);
    // every loss of a loaded, turning traction motor is positive with the demo's loss data (invented): common practice (no source)
    for (const v of b.y) expect(v).toBeGreaterThan(0);
    expect((f.layout as unknown as { yaxis: { title: { text: string } } }).yaxis.title.text).toBe('power loss (W)');
  });

  it('the loss saved by loss-minimising control: contours in W from 0, null outside, the chosen point marked', () => {
    const S = speeds.filter((_, i) => i % 2 === 1), T = torques.filter((_, j) => j % 2 === 1);
    const { gain } = minLossGainMap(p.models.hot, p.peak, lossConditionsFromProject(p), S, T);
    const z = lossSavedGrid(gain);
    let max = 0, nulls = 0;
    for (let j = 0; j < T.length; j++)
      for (let i = 0; i < S.length; i++) {
        const k = i * T.length + j;
        if (gain.feasible[k]) {
          expect(z[j]![i]).toBe(gain.lossSaved[k]);
          max = Math.max(max, z[j]![i]!);
        } else {
          expect(z[j]![i]).toBeNull();
          nulls++;
        }
      }
    expect(nulls).toBeGreaterThan(0);
    // iron loss makes field weakening pay somewhere (Morimoto et al. (1994), IEEE Trans. Ind. Electron. 41(5))
    expect(max).toBeGreaterThan(1);
    const f = lossSavedFigure(gain, env, [], theme, CURVE.light, { speed_rpm: 4000, torque_Nm: 50 });
    const c = f.data[0] as unknown as { type: string; zmin: number; zmax: number; contours: { start: number; end: number; size: number }; colorbar: { title: { text: string }; ticksuffix: string } };
    expect(c.type).toBe('contour');
    expect(c.contours.start).toBe(0);
    expect(c.zmin).toBe(0);
    expect(c.zmax).toBeGreaterThanOrEqual(max);
    expect(c.zmax).toBeLessThanOrEqual(max + c.contours.size + 1e-12);
    expect(c.colorbar.title.text).toBe('loss saved, W');
    expect(c.colorbar.ticksuffix).toBe(' W');
    const mark = f.data.find((d) => (d as { name?: string }).name === 'chosen point') as { x: number[]; y: number[] };
    expect(mark.x).toEqual([4000]);
    expect(mark.y).toEqual([50]);
    expect(f.data.map((d) => (d as { name?: string }).name)).toContain('peak envelope, hot magnet');
    // no chosen point, no mark (common practice (no source))
    expect(efficiencyFigure(map, 'system', env, [], theme, CURVE.light).data.some((d) => (d as { name?: string }).name === 'chosen point')).toBe(false);
  });

  it('contour steps are 1, 2 or 5 times a power of ten, about ten levels (common practice (no source))', () => {
    expect(niceStep(37)).toBe(5);
    expect(niceStep(100)).toBe(10);
    expect(niceStep(0.9)).toBeCloseTo(0.1, 15);
    expect(niceStep(150)).toBe(20);
    expect(niceStep(0)).toBe(1);
  });

  it('the loss bar of a chosen point under both rules, least current first', () => {
    const c = lossConditionsFromProject(p);
    const a = solveLossPoint(p.models.hot, p.peak, c, 900, 40);
    const b = solveLossPoint(p.models.hot, p.peak, c, 900, 40, { minLoss: true });
    const f = lossBarFigure(a, theme, CURVE.light, b);
    const [t0, t1] = f.data as unknown as Array<{ name: string; y: number[] }>;
    expect(t0!.name).toBe('least current');
    expect(t1!.name).toBe('loss-minimising');
    expect(t1!.y).toEqual([b.losses.copper_W, b.losses.iron_W, b.losses.mechanical_W, b.losses.inverter_W]);
    // the loss-minimising current trades copper for iron and inverter loss, never more in total (Morimoto et al. (1994))
    expect(t1!.y.reduce((x, y) => x + y, 0)).toBeLessThanOrEqual(t0!.y.reduce((x, y) => x + y, 0));
    expect((f.layout as unknown as { barmode: string }).barmode).toBe('group');
  });
});

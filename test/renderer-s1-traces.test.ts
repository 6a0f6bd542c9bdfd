// The S1 curve on the envelope view: the core's continuous torque (datasheetContinuousOf) split into
// runs of one binding limit, each drawn in that limit's line style with one legend entry per limit;
// a project without a thermal section has no S1 curve and a torque-speed figure unchanged.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadProjectText } from '../src/core/project/project';
import { datasheetContinuousOf } from '../src/core/reports/datasheet-parts';
import { computeEnvelope } from '../src/core/steady-state/envelope';
import type { ContinuousPoint } from '../src/core/steady-state/continuous-torque';
import { projectSpeedRange } from '../src/core/reports/speed-range';
import { S1_DASH, S1_NO_LEGEND, s1Name, s1Runs, s1Traces } from '../src/renderer/src/components/s1-traces';

const load = (f: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', f), 'utf8'));
const spm = load('demo-spm-48v.json');
const wMax = projectSpeedRange(spm).speedMax;
const s1 = datasheetContinuousOf(spm, wMax, 60)!;
type Tr = { name?: string; x: number[]; y: number[]; yaxis?: string; showlegend?: boolean; meta?: string; line: { dash: string }; text: string[] };

const pt = (limitedBy: ContinuousPoint['limitedBy'], k: number): ContinuousPoint => ({ speed_rpm: k, torque_Nm: 1, limitedBy, windingTemp_C: 100, magnetTemp_C: 90, junctionTemp_C: 60 });

describe('runs of one binding limit', () => {
  it('splits where the limit changes, each later run starting at the last point of the one before', () => {
    const pts = [pt('magnet', 0), pt('magnet', 1), pt('winding', 2), pt('current', 3), pt('current', 4)];
    expect(s1Runs(pts)).toEqual([
      { limit: 'magnet', k0: 0, k1: 1 },
      { limit: 'winding', k0: 1, k1: 2 },
      { limit: 'current', k0: 2, k1: 4 },
    ]);
  });
});

describe('the S1 traces of the 48 V demo', () => {
  it('has a thermal section, so an S1 curve, below the cold peak envelope at every speed', () => {
    const cold = computeEnvelope(spm.models.cold, spm.peak, { points: 60, speedMax: wMax, direction: 'motoring' });
    expect(s1.motoring.length).toBe(60);
    // S1 lies within the peak envelope (IEC 60034-1: the continuous rating under the short-time one)
    for (let k = 0; k < 60; k++) if (cold.feasible[k]) expect(s1.motoring[k]!.torque_Nm).toBeLessThanOrEqual(cold.torque[k]! + 1e-9);
    for (const q of s1.generating) expect(q.torque_Nm).toBeLessThanOrEqual(0);
  });

  it('draws each run in its limit\'s style, one legend entry per limit, the hover naming the limit', () => {
    const d = s1Traces(s1, '#00695c', true, true) as unknown as Tr[];
    const torque = d.filter((t) => t.yaxis !== 'y2');
    const limits = new Set([...s1.motoring, ...s1.generating].map((q) => q.limitedBy));
    // the demo's S1 is bound by more than one limit (a thermal limit at low speed)
    expect(limits.size).toBeGreaterThan(1);
    expect(torque.filter((t) => t.showlegend).map((t) => t.name).sort()).toEqual([...limits].map(s1Name).sort());
    for (const t of torque) {
      const l = [...limits].find((x) => s1Name(x) === t.name)!;
      expect(t.line.dash).toBe(S1_DASH[l]);
      expect(t.text.every((s) => s.includes('limited by'))).toBe(true);
    }
    // every point drawn once, plus one shared point per boundary between runs
    const runs = s1Runs(s1.motoring).length + s1Runs(s1.generating).length;
    expect(torque.reduce((n, t) => n + t.x.length, 0)).toBe(s1.motoring.length + s1.generating.length + runs - 2);
    // power, kW = torque * speed (common practice (no source))
    const power = d.filter((t) => t.yaxis === 'y2');
    expect(power.length).toBe(torque.length);
    expect(power[0]!.y[10]).toBeCloseTo((torque[0]!.y[10]! * torque[0]!.x[10]! * Math.PI) / 30 / 1000, 12);
    expect(power.filter((t) => t.meta !== S1_NO_LEGEND).length).toBe(limits.size);
  });

  it('leaves generating out when asked, and draws no S1 for a file without a thermal section', () => {
    const d = s1Traces(s1, '#00695c', false, false) as unknown as Tr[];
    expect(d.reduce((n, t) => n + t.x.length, 0)).toBe(s1.motoring.length + s1Runs(s1.motoring).length - 1);
    const { thermal: _t, ...file } = JSON.parse(readFileSync(join(__dirname, '..', 'resources', 'demo-spm-48v.json'), 'utf8')) as Record<string, unknown>;
    delete file.dutyCycle;
    // (its tolerance band on the coolant temperature goes with the thermal section, as the input side does)
    delete (file.tolerances as Record<string, unknown>)['thermal.coolantTemp_C'];
    expect(datasheetContinuousOf(loadProjectText(JSON.stringify(file)), wMax, 20)).toBeNull();
  });
});

describe('the torque-speed figures with and without S1', () => {
  let fig: typeof import('../src/renderer/src/components/torque-speed-figure');
  let compute: typeof import('../src/renderer/src/state/compute');
  beforeAll(async () => {
    // the figures read the theme from the page's CSS variables: a page of plain colours here
    const g = globalThis as Record<string, unknown>;
    g.document ??= { documentElement: { dataset: {} } };
    g.getComputedStyle ??= () => ({ getPropertyValue: () => '#123456' });
    fig = await import('../src/renderer/src/components/torque-speed-figure');
    compute = await import('../src/renderer/src/state/compute');
  });
  const show = { peak: true, continuous: true, hot: true, cold: true, generating: true };

  it('without S1 the figure is the one drawn before (no S1 argument)', () => {
    const r = compute.computeResults(spm, compute.DEFAULT_ENVELOPE_OPTIONS);
    expect(JSON.stringify(fig.torqueSpeedFigure(r, 'light', show, true, 460, null))).toBe(JSON.stringify(fig.torqueSpeedFigure(r, 'light', show, true)));
  });

  it('with S1 the torque plot gains the S1 runs and the power plot one legend entry per limit', () => {
    const r = compute.computeResults(spm, compute.DEFAULT_ENVELOPE_OPTIONS);
    const s = datasheetContinuousOf(spm, r.speedMax, r.points)!;
    const limits = new Set([...s.motoring, ...s.generating].map((q) => q.limitedBy));
    const base = fig.torqueOnlyFigure(r, 'light', show).data.length;
    const withS1 = fig.torqueOnlyFigure(r, 'light', show, s).data as unknown as Tr[];
    expect(withS1.length).toBe(base + s1Runs(s.motoring).length + s1Runs(s.generating).length);
    const p = fig.powerSpeedFigure(r, 'light', show, s).data as unknown as Tr[];
    expect(p.filter((t) => t.name?.startsWith('S1') && t.showlegend).length).toBe(limits.size);
    // hidden S1 continuous-current curve: not drawn with the continuous curves off
    expect(fig.torqueOnlyFigure(r, 'light', { ...show, continuous: false }, s).data.length).toBe(fig.torqueOnlyFigure(r, 'light', { ...show, continuous: false }).data.length);
  });
});

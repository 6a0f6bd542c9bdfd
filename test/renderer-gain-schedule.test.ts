// The tuning view's gain-schedule data path (views/tuning/gain-schedule-data.ts): on the flux-map demo
// the table cells are the core's schedule in the report's units and the figure plots its Kp per axis;
// a constant-parameter demo gets the one line instead of a table.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadProjectText, type ResolvedProject } from '../src/core/project/project';
import { gainSchedule } from '../src/core/control/gain-schedule';
import { tuningInputFromProject } from '../src/core/project/tuning-from-project';
import { gainScheduleFigure, gainScheduleView } from '../src/renderer/src/views/tuning/gain-schedule-data';
import { CURVE, type PlotTheme } from '../src/renderer/src/components/plot-style';

const demo = (name: string): ResolvedProject => loadProjectText(readFileSync(join(__dirname, '..', 'resources', name), 'utf8'));
const theme: PlotTheme = { ink: '#111111', muted: '#666666', line: '#dddddd', panel: '#ffffff', bg: '#f5f5f5', ok: '#2e7d32', bad: '#b3261e', dark: false };

describe('tuning view: gains against current', () => {
  it('flux-map demo: the cells equal gainSchedule on the project input up to its peak current', () => {
    const p = demo('demo-ipm-saturated.json');
    const v = gainScheduleView(p);
    if (v.kind !== 'schedule') throw new Error(`expected a schedule, got ${v.kind}`);
    const s = gainSchedule(tuningInputFromProject(p), p.peak.Imax);
    expect(v.schedule).toEqual(s);
    expect(v.cells.length).toBe(s.rows.length);
    for (let i = 0; i < s.rows.length; i++) {
      const r = s.rows[i]!, c = v.cells[i]!;
      expect(c[0]).toBe(r.current_A);
      // rms = peak / sqrt 2: common practice (no source)
      expect(c[1]).toBeCloseTo(r.current_A / Math.SQRT2, 12);
      expect([c[2], c[3]]).toEqual([r.id_A, r.iq_A]);
      expect(c[4]).toBeCloseTo(r.Ldd_H * 1e3, 12);
      expect(c[5]).toBeCloseTo(r.Lqq_H * 1e3, 12);
      expect(c.slice(6)).toEqual([r.Kp_d, r.Ki_d, r.Kp_q, r.Ki_q]);
    }
    expect(v.headers).toContain('Kp q V/A');
    // Lq saturates along MTPA, so Kp_q falls with current: common practice (no source)
    expect(s.rows.at(-1)!.Kp_q).toBeLessThan(s.rows[0]!.Kp_q);
    expect(v.caption).toMatch(/600 Hz on both axes/);
  });

  it('the figure: Kp d and Kp q against current in A peak, axes with units', () => {
    const p = demo('demo-ipm-saturated.json');
    const v = gainScheduleView(p);
    if (v.kind !== 'schedule') throw new Error('expected a schedule');
    const f = gainScheduleFigure(v.schedule, theme, CURVE.light);
    expect(f.data.length).toBe(2);
    const [d, q] = f.data as Array<{ x: number[]; y: number[]; name: string }>;
    expect(d!.x).toEqual(v.schedule.rows.map((r) => r.current_A));
    expect(d!.y).toEqual(v.schedule.rows.map((r) => r.Kp_d));
    expect(q!.y).toEqual(v.schedule.rows.map((r) => r.Kp_q));
    const L = f.layout as { xaxis: { title: { text: string } }; yaxis: { title: { text: string } } };
    expect(L.xaxis.title.text).toMatch(/A peak/);
    expect(L.yaxis.title.text).toMatch(/V\/A/);
  });

  it('constant-parameter demos: one line, no table (constant inductances give equal gains at every current)', () => {
    // common practice (no source)
    for (const f of ['demo-ipm-traction.json', 'demo-servo-axis.json', 'demo-spm-48v.json']) {
      const v = gainScheduleView(demo(f));
      expect(v.kind, f).toBe('constant');
      if (v.kind === 'constant') expect(v.line).toMatch(/do not change with current/);
    }
  });
});

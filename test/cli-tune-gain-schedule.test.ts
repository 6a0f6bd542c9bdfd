// tune on a flux-map project: the table of current-loop gains against current along MTPA and the
// gainSchedule key of --json (the shape of control/gain-schedule.ts); constant-parameter projects
// keep their document without it.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from './cli-run';
import { loadProjectText } from '../src/core/project/project';
import { gainScheduleFromProject } from '../src/core/project/tuning-from-project';

const demo = (name: string): string => join(__dirname, '..', 'resources', name);

describe('tune with a flux map', () => {
  it('--json carries the gain schedule; Kp_q at the peak current is below Kp_q at zero current', async () => {
    const r = await runCli('tune', demo('demo-ipm-saturated.json'), '--json');
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.out);
    const s = doc.gainSchedule;
    const p = loadProjectText(readFileSync(demo('demo-ipm-saturated.json'), 'utf8'));
    // the document is the core's schedule, number for number
    expect(s).toEqual(gainScheduleFromProject(p));
    expect(s.rows.length).toBe(11);
    expect(s.rows[0].current_A).toBe(0);
    expect(s.rows[10].current_A).toBe(p.peak.Imax);
    // Lq saturates with current, so the q gain that keeps the crossover falls: common practice (no source)
    expect(s.rows[10].Kp_q).toBeLessThan(s.rows[0].Kp_q);
    expect(s.rows[10].Lqq_H).toBeLessThan(0.8 * s.rows[0].Lqq_H);
    // row 0 is the tuning printed above it (internal model control, Harnefors and Nee (1998),
    // "Model-based current control of AC machines using the internal model control method")
    expect(s.rows[0].Kp_q).toBe(doc.currentQ.Kp);
    expect(s.rows[0].Kp_d).toBe(doc.current.Kp);
  });

  it('the text output prints the table with units, one row per current step', async () => {
    const r = await runCli('tune', demo('demo-ipm-saturated.json'));
    expect(r.code).toBe(0);
    const lines = r.out.split('\n');
    const h = lines.findIndex((l) => /I A peak\s+I A rms\s+id A\s+iq A\s+Ldd mH\s+Lqq mH\s+Kp d V\/A\s+Ki d V\/\(A·s\)\s+Kp q V\/A\s+Ki q V\/\(A·s\)/.test(l));
    expect(h).toBeGreaterThan(0);
    // the header, its rule, 11 rows (0..450 A peak: the demo's peak limit)
    const last = lines[h + 12]!.trim().split(/\s+/);
    expect(Number(last[0])).toBe(450);
    // 450 A peak is 318.2 A rms (peak / sqrt 2): common practice (no source)
    expect(Number(last[1])).toBeCloseTo(318.2, 1);
    expect(r.out).toMatch(/current-loop gains against current: Along MTPA \(motoring\)/);
  });

  it('constant-parameter demos: no gainSchedule key and no table', async () => {
    // common practice (no source): constant inductances give the same gains at every current
    for (const f of ['demo-ipm-traction.json', 'demo-servo-axis.json', 'demo-spm-48v.json']) {
      const j = await runCli('tune', demo(f), '--json');
      expect(j.code).toBe(0);
      expect(Object.keys(JSON.parse(j.out))).not.toContain('gainSchedule');
      const t = await runCli('tune', demo(f));
      expect(t.out).not.toMatch(/I A peak/);
    }
  });
});

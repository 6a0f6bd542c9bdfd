// The corners of a tolerance study (src/core/project/tolerance-corners.ts) against the analytic worst
// case of a machine whose torque is linear in its parameters: a surface-magnet motor at low speed,
// within the current limit, gives T = 3/2 p psiM I (Krishnan (2010), "Permanent Magnet Synchronous
// and Brushless DC Motor Drives", the torque of a surface PMSM; from memory), so the least torque
// over the bands of psiM and Imax lies at both lower ends and is 3/2 p psiM_min Imax_min.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseProject } from '../src/core/project/schema';
import { cornerValueSets, FULL_FACTORIAL_MAX, toleranceCorners } from '../src/core/project/tolerance-corners';
import type { ToleranceParameter } from '../src/core/project/tolerance-apply';
import { sizeDrive } from '../src/core/steady-state/sizing';
import { resolveProject } from '../src/core/project/project';
import { linearSpm } from './tolerance-fixtures';

describe('corners', () => {
  it('the analytic worst case of a torque linear in psiM and Imax: both lower ends, margin 3/2 p psiM_min Imax_min - T', () => {
    const f = parseProject(linearSpm({ 'motor.psiM': { minus_pct: 10, plus_pct: 10 }, 'inverter.Imax': { minus_pct: 5, plus_pct: 5 }, 'motor.Rs': { minus_pct: 20, plus_pct: 20 } }));
    const r = toleranceCorners(f);
    expect(r.plan).toBe('every-combination');
    expect(r.corners).toHaveLength(8);
    const worst = 1.5 * 4 * 0.018 * 95 - 10;
    const b = r.requirements[0]!;
    expect(b.worstMargin_Nm).toBeCloseTo(worst, 9);
    expect(r.corners[b.bindingCorner]!.parameters['motor.psiM']).toBeCloseTo(0.018, 15);
    expect(r.corners[b.bindingCorner]!.parameters['inverter.Imax']).toBe(95);
    expect(r.corners[r.bindingCorner]!.parameters['motor.psiM']).toBeCloseTo(0.018, 15);
    // every corner's margin is the formula at its own values (Rs does not move it at low speed within the voltage limit)
    for (const c of r.corners) expect(c.requirements[0]!.margins.torque_Nm).toBeCloseTo(1.5 * 4 * c.parameters['motor.psiM']! * c.parameters['inverter.Imax']! - 10, 9);
    expect(r.allMet).toBe(true);
    // the least Imax over every corner: the torque at the weakest magnet, T / (3/2 p psiM_min)
    expect(r.minImax_A).toBeCloseTo(10 / (1.5 * 4 * 0.018), 6);
    expect(r.minVdc_V).not.toBeNull();
  });

  it('a band that makes the point fail at its worst corner: met at the other corners only, the shortfall at the binding one', () => {
    const f = parseProject(linearSpm({ 'motor.psiM': { minus_pct: 10, plus_pct: 10 } }, 11));
    const r = toleranceCorners(f);
    expect(r.corners.map((c) => c.requirements[0]!.met)).toEqual([false, true]);
    expect(r.requirements[0]!.worstMargin_Nm).toBeCloseTo(1.5 * 4 * 0.018 * 100 - 11, 9);
    expect(r.allMet).toBe(false);
  });

  it('no bands: one corner, the nominal sizing (as the size command)', () => {
    const j = JSON.parse(readFileSync(join(__dirname, '..', 'resources', 'demo-servo-axis.json'), 'utf8'));
    j.tolerances = {};
    const f = parseProject(j);
    const r = toleranceCorners(f, { thermal: false });
    const p = resolveProject(f);
    const hot = sizeDrive(p.models.hot, p.inverter, p.requirements, p.currentLimits), cold = sizeDrive(p.models.cold, p.inverter, p.requirements, p.currentLimits);
    expect(r.corners).toHaveLength(1);
    expect(r.corners[0]!.requirements.map((q) => q.met)).toEqual(hot.points.map((q, k) => q.met && cold.points[k]!.met));
    expect(r.minImax_A).toBe(Math.max(hot.minImax!, cold.minImax!));
  });

  it('above the full-factorial limit: one at a time, then all lower and all upper (2k + 3 sets)', () => {
    const k = FULL_FACTORIAL_MAX + 1;
    const ps = Array.from({ length: k }, (_, i) => ({ path: 'motor.Rs', nominal: i, min: i - 1, max: i + 1, unit: '' })) as ToleranceParameter[];
    const { plan, sets } = cornerValueSets(ps);
    expect(plan).toBe('one-at-a-time-and-extremes');
    expect(sets).toHaveLength(2 * k + 3);
    expect(sets[0]).toEqual(ps.map((p) => p.nominal));
    expect(sets[2 * k + 1]).toEqual(ps.map((p) => p.min));
    expect(sets[2 * k + 2]).toEqual(ps.map((p) => p.max));
    expect(cornerValueSets(ps.slice(0, 3)).sets).toHaveLength(8);
  });
});

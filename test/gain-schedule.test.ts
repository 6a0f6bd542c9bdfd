// The current-loop gain schedule along MTPA (src/core/control/gain-schedule.ts): internal-model
// gains Kp = L_inc omega_c, Ki = Rs omega_c per axis from the incremental inductances at each
// operating point, Harnefors and Nee (1998), "Model-based current control of AC machines using the
// internal model control method", IEEE Trans. Ind. Appl. 34(1).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { gainSchedule } from '../src/core/control/gain-schedule';
import { tuneLoops, type TuningInput } from '../src/core/control/tuning';
import { mtpaCurrents } from '../src/core/steady-state/mtpa';
import { FluxMapModel, type FluxMapData } from '../src/core/machine/flux-map';
import type { DqMachine } from '../src/core/machine/dq-machine';
import { loadProjectText } from '../src/core/project/project';
import { gainScheduleFromProject, tuneFromProject, tuningInputFromProject } from '../src/core/project/tuning-from-project';
import { InputError } from '../src/core/base/errors';

const ipm: DqMachine = { polePairs: 4, Rs: 0.05, Ld: 0.3e-3, Lq: 0.9e-3, psiM: 0.06 };
const inp = (machine: TuningInput['machine'], current: TuningInput['current'] = { bandwidth_Hz: 500 }): TuningInput => ({
  machine, inertia: 2e-3, viscousFriction: 1e-4, fCtrl_Hz: 10000, delaySamples: 1, speedLoopDivider: 1, current, speed: { method: 'bandwidth', bandwidth_Hz: 50 },
});

/**
 * An invented saturating q axis: psi_q = Lq0 I0 asinh(iq / I0), so L_qq = Lq0 / sqrt(1 + (iq/I0)²)
 * exactly; psi_d = Ld id + psiM. Tabulated on a fine grid (bilinear map: the derivative is a cell's
 * secant slope, within about a percent of the exact one at this spacing).
 */
const LQ0 = 0.9e-3, I0 = 100;
const lqq = (iq: number): number => LQ0 / Math.sqrt(1 + (iq / I0) ** 2);
function saturatingMap(): FluxMapModel {
  const n = 201, span = 300;
  const g = Array.from({ length: n }, (_, k) => -span + (2 * span * k) / (n - 1));
  const d: FluxMapData = {
    magnetTemp_C: 20, id_A: g, iq_A: g,
    psid_Wb: g.map((id) => g.map(() => ipm.Ld * id + ipm.psiM)),
    psiq_Wb: g.map(() => g.map((iq) => LQ0 * I0 * Math.asinh(iq / I0))),
  };
  return new FluxMapModel(d, ipm.polePairs, ipm.Rs);
}

describe('gain schedule along MTPA', () => {
  it('the zero-current row equals tuneLoops, bandwidth design and fixed gains', () => {
    for (const cur of [{ bandwidth_Hz: 500 }, { Kp: 0.8, Ki: 40 }] as const) {
      for (const m of [ipm, saturatingMap()]) {
        const t = tuneLoops(inp(m, cur));
        const r0 = gainSchedule(inp(m, cur), 200).rows[0]!;
        expect(r0.current_A).toBe(0);
        expect(r0.Kp_d).toBe(t.current.Kp);
        expect(r0.Ki_d).toBe(t.current.Ki);
        expect(r0.Kp_q).toBe(t.currentQ!.Kp);
        expect(r0.Ki_q).toBe(t.currentQ!.Ki);
      }
    }
  });

  it('a constant machine: every row has the same gains; the rows follow MTPA at equal steps of current', () => {
    const s = gainSchedule(inp(ipm), 200, 5);
    const wc = 2 * Math.PI * 500;
    expect(s.rows.map((r) => r.current_A)).toEqual([0, 50, 100, 150, 200]);
    expect(s.bandwidthD_Hz).toBeCloseTo(500, 12);
    for (const r of s.rows) {
      expect(r.Kp_d).toBeCloseTo(ipm.Ld * wc, 12);
      expect(r.Kp_q).toBeCloseTo(ipm.Lq * wc, 12);
      expect(r.Ki_d).toBeCloseTo(ipm.Rs * wc, 12);
      expect(Math.hypot(r.id_A, r.iq_A)).toBeCloseTo(r.current_A, 9);
      const c = mtpaCurrents(ipm, r.current_A);
      expect(r.id_A).toBe(c.id);
      expect(r.iq_A).toBe(c.iq);
    }
  });

  it('a saturating q axis: Kp_q = L_qq(iq) omega_c at each row within 1 %, falling with current; Ki = Rs omega_c stays', () => {
    const wc = 2 * Math.PI * 500;
    const s = gainSchedule(inp(saturatingMap()), 250, 6);
    let prev = Infinity;
    for (const r of s.rows) {
      expect(Math.abs(r.Kp_q / (lqq(r.iq_A) * wc) - 1)).toBeLessThan(0.01);
      expect(r.Kp_q).toBeLessThan(prev + 1e-12);
      prev = r.Kp_q;
      expect(r.Ki_q).toBeCloseTo(ipm.Rs * wc, 12);
      expect(r.Kp_d).toBeCloseTo(ipm.Ld * wc, 9);
    }
    // at the top row the q inductance has fallen well below its zero-current value
    expect(s.rows[5]!.Kp_q / s.rows[0]!.Kp_q).toBeLessThan(0.6);
  });

  it('fixed gains: Kp scaled by L_inc(I)/L_inc(0), the crossover Kp/L kept; Ki kept (the IMC rule Ki = Rs omega_c)', () => {
    const s = gainSchedule(inp(saturatingMap(), { Kp: 0.8, Ki: 40 }), 250, 6);
    for (const r of s.rows) {
      expect(r.Kp_q / r.Lqq_H).toBeCloseTo(0.8 / s.rows[0]!.Lqq_H, 6);
      expect(r.Ki_q).toBe(40);
    }
    expect(s.bandwidthQ_Hz).toBeCloseTo(0.8 / s.rows[0]!.Lqq_H / (2 * Math.PI), 9);
  });

  it('bad input names the field', () => {
    expect(() => gainSchedule(inp(ipm), 0)).toThrow(InputError);
    expect(() => gainSchedule(inp(ipm), 0)).toThrow(/inverter\.Imax/);
    expect(() => gainSchedule(inp(ipm), 100, 1)).toThrow(/points/);
    expect(() => gainSchedule(inp(ipm, { bandwidth_Hz: 0 }), 100)).toThrow(/control\.currentBandwidth_Hz/);
  });

  it('a project: its tuning input up to its peak current; row 0 equals the project tuning', () => {
    const p = loadProjectText(readFileSync(resolve(__dirname, '..', 'resources', 'demo-ipm-traction.json'), 'utf8'));
    const s = gainScheduleFromProject(p);
    const t = tuneFromProject(p);
    expect(s.rows.length).toBe(11);
    expect(s.rows[10]!.current_A).toBe(p.peak.Imax);
    expect(s.rows[0]!.Kp_q).toBe(t.currentQ!.Kp);
    expect(s.rows[0]!.Kp_d).toBe(t.current.Kp);
    expect(s.Rs_ohm).toBe(tuningInputFromProject(p).machine.Rs);
    // JSON shape: plain numbers only (for the CLI and the tuning view)
    expect(JSON.parse(JSON.stringify(s))).toEqual(s);
  });
});

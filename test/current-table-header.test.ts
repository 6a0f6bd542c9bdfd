// The exported C header read back from its text (numbers parsed, nothing taken from the table object)
// and interpolated bilinearly as its notes say: the solver's torque within the bound the header
// states, and never more than that bound over the current or voltage limit (issue 16's check).
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { loadProjectText, type ResolvedProject } from '../src/core/project/project';
import { buildCurrentTable } from '../src/core/control/current-table';
import { currentTableBound } from '../src/core/control/current-table-bound';
import { currentTableAbout, currentTableInputs } from '../src/core/reports/current-table-export';
import { cFloat, cFloatUp, commentText, currentTableHeader } from '../src/core/reports/current-table-header';
import { solveOperatingPoint } from '../src/core/steady-state/operating-point';
import { maxTorquePoint } from '../src/core/steady-state/envelope';
import type { MachineModel } from '../src/core/machine/machine-model';

const demo = (name: string) => loadProjectText(readFileSync(join(__dirname, '..', 'resources', `${name}.json`), 'utf8'));

/** #define NAME value (a number, an `f` suffix allowed) from the header text. */
function define(text: string, name: string): number {
  const m = new RegExp(`^#define ${name} ([-+0-9.eE]+)f?\\b`, 'm').exec(text);
  if (!m) throw new Error(`no #define ${name}`);
  return Number(m[1]);
}

/** static const float NAME[...] = { ... }; the numbers in order (nested braces flattened). */
function floats(text: string, name: string): number[] {
  const m = new RegExp(`static const float ${name}(?:\\[[A-Z_]+\\])+ = \\{([^;]*)\\};`).exec(text);
  if (!m) throw new Error(`no array ${name}`);
  return m[1]!.replace(/[{}\s]/g, '').split(',').filter((s) => s !== '').map((s) => Number(s.replace(/f$/, '')));
}

/** The bilinear read of the notes, written out here on the parsed arrays: [id, iq, clamped demand]. */
function read(h: ReturnType<typeof parse>, corner: string, x: number, T: number): [number, number, number] {
  const tm = h.arrays[`twct_tmot_${corner}`]!, tg = h.arrays[`twct_tgen_${corner}`]!, id = h.arrays[`twct_id_${corner}`]!, iq = h.arrays[`twct_iq_${corner}`]!;
  const s = (Math.min(x, h.xMax) / h.xMax) * (h.nS - 1);
  const r = Math.min(Math.floor(s), h.nS - 2), f = s - r;
  const hi = tm[r]! + f * (tm[r + 1]! - tm[r]!), lo = -(tg[r]! + f * (tg[r + 1]! - tg[r]!));
  const Tc = Math.min(Math.max(T, lo), hi);
  const u = ((Tc + h.peak) / (2 * h.peak)) * (h.nT - 1);
  const c = Math.max(0, Math.min(Math.floor(u), h.nT - 2)), g = Math.min(1, u - c);
  const at = (a: number[], rr: number, cc: number) => a[rr * h.nT + cc]!;
  const bl = (a: number[]) => (1 - f) * (1 - g) * at(a, r, c) + f * (1 - g) * at(a, r + 1, c) + (1 - f) * g * at(a, r, c + 1) + f * g * at(a, r + 1, c + 1);
  return [bl(id), bl(iq), Tc];
}

function parse(text: string, corners: string[]) {
  const arrays: Record<string, number[]> = {};
  for (const n of ['twct_speed_axis', 'twct_torque_axis', ...corners.flatMap((c) => [`twct_tmot_${c}`, `twct_tgen_${c}`, `twct_id_${c}`, `twct_iq_${c}`])]) arrays[n] = floats(text, n);
  return {
    nS: define(text, 'TWCT_SPEED_POINTS'), nT: define(text, 'TWCT_TORQUE_POINTS'), xMax: define(text, 'TWCT_X_MAX'), peak: define(text, 'TWCT_TORQUE_PEAK'),
    bound: { torque: define(text, 'TWCT_BOUND_TORQUE_NM'), current: define(text, 'TWCT_BOUND_CURRENT_A'), voltage: define(text, 'TWCT_BOUND_VOLTAGE_V') },
    arrays,
  };
}

function exportHeader(p: ResolvedProject, nS: number, nT: number) {
  const inputs = currentTableInputs(p, { speedPoints: nS, torquePoints: nT, corners: 'both', minLoss: false });
  const t = buildCurrentTable(inputs.corners, inputs.spec);
  const bound = currentTableBound(t, inputs.corners.map((c) => c.model));
  return { t, text: currentTableHeader(t, currentTableAbout(p, inputs, bound, '2026-01-02')) };
}

/** Checks the header's read at cell midpoints and edge midpoints (and nodes): a lattice of half cells. */
function check(p: ResolvedProject, text: string, bus: number) {
  const h = parse(text, ['hot', 'cold']);
  let worstT = 0, worstI = 0, worstV = 0, n = 0;
  const v = new Float64Array(2);
  for (const corner of ['hot', 'cold'] as const) {
    const m = p.models[corner] as MachineModel;
    for (let a = 0; a <= 2 * (h.nS - 1); a++) {
      const x = (h.xMax * a) / (2 * (h.nS - 1));
      const w = (x * bus) / m.polePairs;
      for (let b = 0; b <= 2 * (h.nT - 1) + 2; b++) {
        // one step past each end: a demand beyond the axis is clamped too
        const T = -h.peak + (2 * h.peak * (b - 1)) / (2 * (h.nT - 1));
        const [id, iq, Tc] = read(h, corner, x, T);
        // the solver's torque for the clamped demand: the demand when it can be held, else the largest torque there
        const op = solveOperatingPoint(m, p.peak, w, Tc);
        const Tref = op.feasible ? Tc : maxTorquePoint(m, p.peak, w, Tc >= 0 ? 'motoring' : 'generating').torque;
        worstT = Math.max(worstT, Math.abs(m.torque(id, iq) - Tref));
        worstI = Math.max(worstI, Math.hypot(id, iq) - p.peak.Imax);
        m.steadyVoltage(id, iq, m.polePairs * w, v);
        worstV = Math.max(worstV, Math.hypot(v[0]!, v[1]!) - p.peak.Vmax);
        n++;
      }
    }
  }
  return { h, worstT, worstI, worstV, n };
}

describe('current-reference table: the C header read back', () => {
  const cases: Array<[string, number, number]> = [['demo-ipm-traction', 17, 11], ['demo-ipm-saturated', 9, 7], ['demo-spm-48v', 13, 9]];
  for (const [name, nS, nT] of cases) {
    it(`${name}: parsed and interpolated bilinearly, within the stated bound of the solver's torque, the current and the voltage limit`, () => {
      const p = demo(name);
      const { t, text } = exportHeader(p, nS, nT);
      const r = check(p, text, t.bus_V);
      expect(r.h.nS).toBe(nS);
      expect(r.h.nT).toBe(2 * nT - 1);
      expect(r.h.arrays['twct_id_hot']).toHaveLength(nS * (2 * nT - 1));
      // the bound is stated, finite and small against the peak torque (a 2-5 % table step, common practice (no source))
      expect(r.h.bound.torque).toBeGreaterThan(0);
      expect(r.h.bound.torque / r.h.peak).toBeLessThan(0.06);
      // the read (midpoints and edges, a subset of the bound's lattice, with the operating-point solver as
      // the reference); 1e-6 of the scale for reading the 9-digit decimals (the axis ends differ from their
      // float32 by up to 5e-9 relative, and the voltage moves with x)
      expect(r.worstT).toBeLessThanOrEqual(r.h.bound.torque + 1e-6 * r.h.peak);
      expect(r.worstI).toBeLessThanOrEqual(r.h.bound.current + 1e-6 * p.peak.Imax);
      expect(r.worstV).toBeLessThanOrEqual(r.h.bound.voltage + 1e-6 * p.peak.Vmax);
      expect(r.n).toBeGreaterThan(500);
    }, 120_000);
  }

  it('demo-spm-48v (Ld = Lq): below the base speed the header holds id = 0 and iq = T / (1.5 p psiM) to float precision', () => {
    // MTPA of a machine without saliency is id = 0, so T = 1.5 p psiM iq: Morimoto, Takeda, Hirasa,
    // Taniguchi (1990), Expansion of operating limits for permanent magnet motor by current vector
    // control considering inverter capacity, IEEE Trans. Ind. Appl. 26(5) (MTPA with Ld = Lq)
    const p = demo('demo-spm-48v');
    const { text } = exportHeader(p, 13, 9);
    const h = parse(text, ['hot', 'cold']);
    const torque = h.arrays['twct_torque_axis']!;
    let checked = 0;
    for (const corner of ['hot', 'cold'] as const) {
      const m = p.models[corner];
      const k = 1.5 * m.polePairs * p[corner].psiM;
      const id = h.arrays[`twct_id_${corner}`]!, iq = h.arrays[`twct_iq_${corner}`]!, tm = h.arrays[`twct_tmot_${corner}`]!, tg = h.arrays[`twct_tgen_${corner}`]!;
      // rows 0 and 1 lie below the base speed (the row's largest torque is the standstill one)
      expect(tm[1]).toBe(tm[0]);
      for (let r = 0; r < 2; r++) {
        for (let j = 0; j < h.nT; j++) {
          const T = torque[j]!;
          if (!(T < tm[r]! * (1 - 1e-6) && -T < tg[r]! * (1 - 1e-6))) continue;
          expect(Math.abs(id[r * h.nT + j]!)).toBeLessThan(1e-6 * p.peak.Imax);
          expect(iq[r * h.nT + j]!).toBeCloseTo(Math.fround(T / k), 3);
          checked++;
        }
        // between those rows the bilinear read is the closed form too (iq is linear in T there)
        const [rid, riq] = read(h, corner, (0.5 * h.xMax) / (h.nS - 1), 0.37 * tm[0]!);
        expect(Math.abs(rid)).toBeLessThan(1e-6 * p.peak.Imax);
        expect(Math.abs(riq - (0.37 * tm[0]!) / k)).toBeLessThan(1e-5 * p.peak.Imax);
      }
    }
    expect(checked).toBeGreaterThan(20);
  });

  it('is C: include guards, sizes as #defines, float literals, the project name made safe in the comment', () => {
    const p = { ...demo('demo-spm-48v') };
    p.name = 'evil */ #define X 1\nnext line \u202e';
    const { text } = exportHeader(p, 3, 3);
    expect(text).toMatch(/^#ifndef TWCT_CURRENT_TABLE_H\n#define TWCT_CURRENT_TABLE_H$/m);
    expect(text.trimEnd().endsWith('#endif /* TWCT_CURRENT_TABLE_H */')).toBe(true);
    // the comment closes only once, before the guard (common practice (no source))
    expect(text.indexOf('*/')).toBe(text.indexOf(' */\n#ifndef') + 1);
    expect(text).toContain('Project: evil *?/ #define X 1?next line ?');
    expect(text).toContain('Date: 2026-01-02');
    expect(/[^\x0a\x20-\x7e]/.test(text)).toBe(false);
    expect(commentText('a/*b*/c')).toBe('a/?*b*?/c');
    // float literals: the float32 value in 9 digits reads back to the same float32 (IEEE 754-2008, 5.12.2)
    for (const x of [0, 1, -2.5, 1e-7, 123456.789, Math.PI, -1e30]) {
      const s = cFloat(x);
      expect(s).toMatch(/^-?\d+(\.\d*)?(e[-+]\d+)?f$/);
      expect(Math.fround(Number(s.slice(0, -1)))).toBe(Math.fround(x));
      // a bound is rounded up: never below the value it states
      expect(Number(cFloatUp(x).slice(0, -1))).toBeGreaterThanOrEqual(x);
      expect(Math.fround(Number(cFloatUp(x).slice(0, -1)))).toBeGreaterThanOrEqual(x);
    }
  });
});

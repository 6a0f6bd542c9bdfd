/**
 * The error bound a current-reference table states (current-table.ts): how far the firmware's
 * reading of it (current-table-lookup.ts: demand clamped to the interpolated row maximum, i_d and i_q
 * bilinear, float32 values) strays from the solver.
 *
 * Method: every cell is sampled on a finer lattice, `refine` steps per cell along each axis (refine 4:
 * the nodes, the quarter points, the edge midpoints and the cell midpoint), over the whole axis range
 * of every corner. At each sample (x, T) the table gives (i_d, i_q) and the clamped demand Tc; the
 * machine model gives their torque and steady voltage at w_e = x V_bus. The solver's torque for Tc is
 * Tc when it lies within the true largest motoring and generating torque at that x (maxTorquePoint),
 * else that largest torque. Reported: the largest torque error |T(i) - T_solver|, the largest excess of
 * |i| over Imax and of |v| over Vmax (0 when none), and the three relative to the peak torque, Imax and
 * Vmax; their largest is the one relative bound stated. A sampled maximum: between samples the error
 * can be larger by the variation over a sub-cell (refine more for a tighter statement).
 */
import type { MachineInput } from '../machine/machine-model';
import { machineModel } from '../machine/linear-dq';
import { maxTorquePoint } from '../steady-state/envelope';
import type { CurrentTable } from './current-table';
import { rowSpeed } from './current-table';
import { lookupCurrentTable, type CurrentTableView } from './current-table-lookup';

export interface CurrentTableBound {
  /** largest |torque of the table's current - the solver's torque for the clamped demand|, N·m */
  torque_Nm: number;
  /** largest |i_dq| - Imax, A (0 when never over) */
  current_A: number;
  /** largest |v_dq| - Vmax, V peak phase (0 when never over) */
  voltage_V: number;
  /** max(torque_Nm / torquePeak, current_A / Imax, voltage_V / Vmax): the stated bound */
  relative: number;
  /** sub-steps per cell along each axis */
  refine: number;
  /** samples checked */
  samples: number;
  /** where the torque error is largest */
  worstTorque: { corner: string; x: number; torque_Nm: number };
}

/** The view of one corner of a table, for lookupCurrentTable. */
export const cornerView = (t: CurrentTable, k: number): CurrentTableView => {
  const c = t.corners[k]!;
  return { nS: t.nS, nT: t.nT, xMax: t.xMax, torquePeak: t.torquePeak, tMot: c.tMot, tGen: c.tGen, id: c.id, iq: c.iq };
};

/** The bound over all corners; `models[k]` is the machine of `t.corners[k]`. */
export function currentTableBound(t: CurrentTable, models: readonly MachineInput[], refine = 4): CurrentTableBound {
  if (!(Number.isInteger(refine) && refine >= 1)) throw new RangeError('refine must be a whole number >= 1');
  const b: CurrentTableBound = { torque_Nm: 0, current_A: 0, voltage_V: 0, relative: 0, refine, samples: 0, worstTorque: { corner: '', x: 0, torque_Nm: 0 } };
  const { Imax, Vmax } = t.limits;
  const out = new Float64Array(2), v = new Float64Array(2);
  const nX = (t.nS - 1) * refine, nTq = (t.nT - 1) * refine;
  t.corners.forEach((c, k) => {
    const m = machineModel(models[k]!);
    const view = cornerView(t, k);
    for (let a = 0; a <= nX; a++) {
      const x = (t.xMax * a) / nX;
      const w = rowSpeed(x, t.bus_V, m.polePairs);
      const mot = maxTorquePoint(m, t.limits, w, 'motoring');
      const gen = maxTorquePoint(m, t.limits, w, 'generating');
      const motTrue = mot.feasible ? Math.max(0, mot.torque) : 0;
      const genTrue = gen.feasible ? Math.max(0, -gen.torque) : 0;
      const we = m.polePairs * w;
      for (let j = 0; j <= nTq; j++) {
        const T = -t.torquePeak + (2 * t.torquePeak * j) / nTq;
        const Tc = lookupCurrentTable(view, x, T, out);
        const Tref = Math.min(Math.max(Tc, -genTrue), motTrue);
        const id = out[0]!, iq = out[1]!;
        const e = Math.abs(m.torque(id, iq) - Tref);
        if (e > b.torque_Nm) { b.torque_Nm = e; b.worstTorque = { corner: c.name, x, torque_Nm: T }; }
        b.current_A = Math.max(b.current_A, Math.hypot(id, iq) - Imax);
        m.steadyVoltage(id, iq, we, v);
        b.voltage_V = Math.max(b.voltage_V, Math.hypot(v[0]!, v[1]!) - Vmax);
        b.samples++;
      }
    }
  });
  b.relative = Math.max(b.torque_Nm / t.torquePeak, b.current_A / Imax, b.voltage_V / Vmax);
  return b;
}

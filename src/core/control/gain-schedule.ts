/**
 * The current-loop gains against current, as a firmware would schedule them: along the MTPA
 * trajectory (motoring, iq >= 0) at current magnitudes 0..Imax, the incremental inductances of the
 * machine model there and the per-axis PI gains that keep the design crossover:
 *
 * - a bandwidth design: Kp = L_inc omega_c, Ki = Rs omega_c per axis (internal model control,
 *   Harnefors and Nee (1998), "Model-based current control of AC machines using the internal model
 *   control method", IEEE Trans. Ind. Appl. 34(1)), with L_inc = d psi_d/d i_d on d and
 *   d psi_q/d i_q on q (the cross terms are left to the decoupling, as in current-loop-plant.ts);
 * - fixed gains Kp, Ki: Kp scaled by L_inc(I) / L_inc(0) per axis, Ki kept, as internal model
 *   control would change them (the crossover Kp/L kept, the PI zero Ki/Kp following the winding pole
 *   Rs/L); the controller's own scheduling (controller.ts, `gainScheduling`) does the same.
 *
 * At zero current the row equals the gains of `tuneLoops` (tuning.ts) for the same input. For a
 * constant-parameter machine every row has the same gains. Not on any hot path (allocates freely).
 */
import { InputError } from '../base/errors';
import { machineModel } from '../machine/linear-dq';
import { mtpaCurrents } from '../steady-state/mtpa';
import { imcCurrentGains, type TuningInput } from './tuning';

/** One row of the schedule: the operating point, its incremental inductances and the PI gains there. */
export interface GainScheduleRow {
  /** current magnitude sqrt(id² + iq²), A peak */
  current_A: number;
  /** MTPA currents at that magnitude, A peak */
  id_A: number;
  iq_A: number;
  /** incremental inductances d psi_d/d i_d, d psi_q/d i_q and the cross terms d psi_d/d i_q, d psi_q/d i_d, H */
  Ldd_H: number;
  Lqq_H: number;
  Ldq_H: number;
  Lqd_H: number;
  /** d-axis PI gains: Kp in V/A, Ki in V/(A·s) */
  Kp_d: number;
  Ki_d: number;
  /** q-axis PI gains: Kp in V/A, Ki in V/(A·s) */
  Kp_q: number;
  Ki_q: number;
}

/** The schedule (its JSON shape: plain numbers and one array of rows). */
export interface GainSchedule {
  /** crossover the gains keep on each axis, Hz (the design bandwidth, or Kp/(2 pi L_inc(0)) of fixed gains) */
  bandwidthD_Hz: number;
  bandwidthQ_Hz: number;
  /** winding resistance the integral gains use, ohm */
  Rs_ohm: number;
  /** rows at current magnitudes 0, Imax/(n-1), ..., Imax, ascending */
  rows: GainScheduleRow[];
}

/** Default number of rows of a schedule (0..Imax in steps of Imax/10). */
export const GAIN_SCHEDULE_POINTS = 11;

/**
 * The gain schedule of a tuning input's machine and current-loop design from zero to Imax (A peak)
 * in `points` equal steps of current magnitude along MTPA.
 */
export function gainSchedule(inp: Pick<TuningInput, 'machine' | 'current'>, Imax: number, points = GAIN_SCHEDULE_POINTS): GainSchedule {
  if (!(Number.isFinite(Imax) && Imax > 0)) throw new InputError('inverter.Imax', 'must be a finite current > 0 A for a gain schedule');
  if (!(Number.isInteger(points) && points >= 2 && points <= 1001)) throw new InputError('points', `must be a whole number in 2..1001 (got ${points})`);
  const model = machineModel(inp.machine);
  const field = model.linear ? 'motor.Ld' : 'motor.fluxMap';
  const L = new Float64Array(4);
  const Rs = model.Rs;
  model.incrementalInductance(0, 0, L);
  const Ld0 = L[0]!, Lq0 = L[3]!;
  if (!(Ld0 > 0 && Lq0 > 0)) throw new InputError(field, 'must give positive incremental inductances at zero current');
  const c = inp.current;
  let wD: number, wQ: number;
  if ('bandwidth_Hz' in c) {
    if (!(c.bandwidth_Hz > 0)) throw new InputError('control.currentBandwidth_Hz', 'must be > 0 Hz');
    wD = wQ = 2 * Math.PI * c.bandwidth_Hz;
  } else {
    wD = c.Kp / Ld0;
    wQ = c.Kp / Lq0;
  }
  const rows: GainScheduleRow[] = [];
  for (let k = 0; k < points; k++) {
    const I = k === points - 1 ? Imax : (Imax * k) / (points - 1);
    const { id, iq } = k === 0 ? { id: 0, iq: 0 } : mtpaCurrents(model, I);
    model.incrementalInductance(id, iq, L);
    const Ldd = L[0]!, Ldq = L[1]!, Lqd = L[2]!, Lqq = L[3]!;
    if (!(Ldd > 0 && Lqq > 0)) {
      throw new InputError(field, `must give positive incremental inductances along MTPA (at id = ${id.toPrecision(4)} A, iq = ${iq.toPrecision(4)} A: Ldd = ${Ldd.toPrecision(4)} H, Lqq = ${Lqq.toPrecision(4)} H)`);
    }
    let gd: { Kp: number; Ki: number }, gq: { Kp: number; Ki: number };
    if ('bandwidth_Hz' in c) {
      gd = imcCurrentGains(Ldd, Rs, wD);
      gq = imcCurrentGains(Lqq, Rs, wQ);
    } else {
      // k = 0: exactly the fixed gains (L/L0 = 1 would round to them too; say so plainly)
      gd = { Kp: k === 0 ? c.Kp : (c.Kp * Ldd) / Ld0, Ki: c.Ki };
      gq = { Kp: k === 0 ? c.Kp : (c.Kp * Lqq) / Lq0, Ki: c.Ki };
    }
    rows.push({ current_A: I, id_A: id, iq_A: iq, Ldd_H: Ldd, Lqq_H: Lqq, Ldq_H: Ldq, Lqd_H: Lqd, Kp_d: gd.Kp, Ki_d: gd.Ki, Kp_q: gq.Kp, Ki_q: gq.Ki });
  }
  return { bandwidthD_Hz: wD / (2 * Math.PI), bandwidthQ_Hz: wQ / (2 * Math.PI), Rs_ohm: Rs, rows };
}

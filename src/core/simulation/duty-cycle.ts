/**
 * Duty-cycle evaluation (quasi-static): at each instant the steady loss point at the temperatures
 * reached, the lumped thermal network advanced exactly between instants (cycle-pass.ts), the cycle
 * repeated from the coolant temperature until the end temperatures of a repeat differ from its start
 * by less than `tolerance_K` (0.1 K) in both nodes; the results are those of that last repeat
 * (cycle-summary.ts).
 *
 * Repeats: 'repeat' starts each repeat at the last one's end (plain repetition: the change from start
 * to end is the change of the end temperatures between repeats). 'extrapolate' (default) seeks the
 * periodic state S = E(S) by quasi-Newton steps on F(S) = E(S) - S: the first with the Jacobian
 * Phi - I, Phi the network's own transition over the cycle (exact for losses that do not depend on
 * temperature; the network is linear given the losses), later ones Broyden-updated from the repeats
 * seen (Broyden 1965, A class of methods for solving nonlinear simultaneous equations, Math. Comp. 19).
 * Either way the last repeat is a full repeat from its start, and the stopping rule is checked on it;
 * 'extrapolate' also asks that the periodic state its next step predicts lies within the tolerance of
 * that start (a repeat that changes little can still sit off the periodic state when the repeats
 * contract slowly).
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { LossConditions } from '../steady-state/point-losses';
import { InputError } from '../base/errors';
import { assertLossConditions } from '../steady-state/loss-point';
import { type CycleArrays, newCyclePass, runPass } from './cycle-pass';
import { type CycleSummary, summarizeCycle } from './cycle-summary';
import { cycleInstants, type DutyCycleSpec, rmsTorque } from './duty-cycle-spec';

export interface DutyCycleOptions {
  /** evaluation step, s; absent: the samples' own instants */
  step_s?: number;
  /** largest change of a repeat's end temperatures from its start that ends the repetition, K (default 0.1) */
  tolerance_K?: number;
  /** most repeats (default 100) */
  maxRepeats?: number;
  /** how the next repeat's start is chosen (default 'extrapolate') */
  periodic?: 'extrapolate' | 'repeat';
  /** solve the loss point at every instant, or at adaptive knots with linear interpolation between (default 'adaptive') */
  solve?: 'adaptive' | 'every-instant';
  /** longest span between solved instants, s (default 5) */
  maxSpan_s?: number;
  /** the interpolation's relative tolerance on loss and current (default 1e-3) */
  interpolationTolerance?: number;
  /** checked every 4096 instants or so: aborted ends the run (the result is then null) */
  signal?: { readonly aborted: boolean };
  /** fraction of the current repeat done, and the repeat (1-based); false ends the run */
  onProgress?: (fraction: number, repeat: number) => boolean | void;
}

export interface DutyCycleResult extends CycleSummary {
  label: string;
  period_s: number;
  /** repeats run, the last one reported */
  repeats: number;
  /** whether the last repeat met the stopping rule (else maxRepeats ended the run) */
  converged: boolean;
  /** largest |end - start| of the last repeat over the two nodes, K */
  lastChange_K: number;
  /** loss points solved in the last repeat and in all */
  solves: { last: number; total: number };
  rmsTorque_Nm: number;
  /** the evaluation instants */
  t_s: Float64Array;
  speed_rpm: Float64Array;
  torque_Nm: Float64Array;
  /** the last repeat's per-instant values */
  traces: CycleArrays;
  /** start temperatures of the last repeat (winding, stator), °C */
  start_C: [number, number];
}

function positive(field: string, v: number | undefined, dflt: number): number {
  if (v === undefined) return dflt;
  if (!(Number.isFinite(v) && v > 0)) throw new InputError(field, `must be a positive number (got ${v})`);
  return v;
}

/** Evaluate a duty cycle on a thermal network; null when cancelled. The run owns `tm` (re-tempered in place). */
export function evaluateDutyCycle(spec: DutyCycleSpec, th: ThermalNetworkSpec, tm: TemperatureModel, c: LossConditions, peak: DriveLimits, opts: DutyCycleOptions = {}): DutyCycleResult | null {
  assertLossConditions(c);
  const x = cycleInstants(spec, opts.step_s);
  const tol = positive('tolerance_K', opts.tolerance_K, 0.1);
  const maxRepeats = Math.floor(positive('maxRepeats', opts.maxRepeats, 100));
  const maxSpan_s = positive('maxSpan_s', opts.maxSpan_s, 5);
  const N = x.t_s.length, period = x.t_s[N - 1]! - x.t_s[0]!;
  const meanDt = period / (N - 1);
  const extrapolate = (opts.periodic ?? 'extrapolate') === 'extrapolate';
  const cp = newCyclePass(x, peak, {
    adaptive: (opts.solve ?? 'adaptive') === 'adaptive',
    maxSpan: Math.max(1, Math.floor(maxSpan_s / meanDt)),
    tolerance: positive('interpolationTolerance', opts.interpolationTolerance, 1e-3),
    transition: extrapolate,
  });
  const S = new Float64Array([th.coolantTemp_C, th.coolantTemp_C]), T = new Float64Array(2), phi = new Float64Array(4);
  // quasi-Newton state: G ~ dF/dS (row-major), the last S and F
  const G = new Float64Array(4), Sp = new Float64Array(2), Fp = new Float64Array(2);
  let r = 0, total = 0, change = Infinity, removed = 0, last = 0, converged = false;
  const start: [number, number] = [S[0]!, S[1]!];
  while (r < maxRepeats) {
    r++;
    T[0] = S[0]!; T[1] = S[1]!;
    start[0] = S[0]!; start[1] = S[1]!;
    const rep = r;
    const o = runPass(cp, tm, th, c, T, phi, (k) => !(opts.signal?.aborted === true || opts.onProgress?.(k / N, rep) === false));
    total += o.solves;
    if (!o.completed) return null;
    removed = o.removed_J; last = o.solves;
    const F0 = T[0]! - S[0]!, F1 = T[1]! - S[1]!;
    change = Math.max(Math.abs(F0), Math.abs(F1));
    if (change < tol && !extrapolate) { converged = true; break; }
    let n0 = T[0]!, n1 = T[1]!; // plain repetition
    if (extrapolate) {
      if (r === 1) { G[0] = phi[0]! - 1; G[1] = phi[1]!; G[2] = phi[2]!; G[3] = phi[3]! - 1; }
      else {
        // Broyden: G += (dF - G dS) dS^T / (dS . dS)
        const d0 = S[0]! - Sp[0]!, d1 = S[1]! - Sp[1]!, dd = d0 * d0 + d1 * d1;
        if (dd > 0) {
          const y0 = F0 - Fp[0]! - (G[0]! * d0 + G[1]! * d1), y1 = F1 - Fp[1]! - (G[2]! * d0 + G[3]! * d1);
          G[0] += (y0 * d0) / dd; G[1] += (y0 * d1) / dd; G[2] += (y1 * d0) / dd; G[3] += (y1 * d1) / dd;
        }
      }
      const det = G[0]! * G[3]! - G[1]! * G[2]!;
      const s0 = -(G[3]! * F0 - G[1]! * F1) / det, s1 = -(-G[2]! * F0 + G[0]! * F1) / det;
      if (Number.isFinite(s0) && Number.isFinite(s1)) { n0 = S[0]! + s0; n1 = S[1]! + s1; }
      // converged when the repeat changed its start by less than tol and the periodic state it predicts is as near
      if (change < tol && Math.max(Math.abs(n0 - S[0]!), Math.abs(n1 - S[1]!)) < tol) { converged = true; break; }
    }
    if (r >= maxRepeats) break;
    Sp[0] = S[0]!; Sp[1] = S[1]!; Fp[0] = F0; Fp[1] = F1;
    S[0] = n0; S[1] = n1;
  }
  opts.onProgress?.(1, r);
  const sum = summarizeCycle(x, cp.a, th, new Float64Array(start), removed);
  return {
    label: spec.label, period_s: period, repeats: r, converged, lastChange_K: change,
    solves: { last, total }, rmsTorque_Nm: rmsTorque(spec),
    t_s: x.t_s, speed_rpm: x.speed_rpm, torque_Nm: x.torque_Nm, traces: cp.a, start_C: start,
    ...sum,
  };
}

/**
 * One repeat of a duty cycle: the loss point at each instant at the temperatures reached, the thermal
 * network advanced exactly between instants (machine/thermal-network.ts, stepTemperatures).
 *
 * Quadrature: the losses of consecutive instants k, k+1 are held at their mean over [t_k, t_k+1]
 * (the trapezoid rule on the per-instant powers, the same rule the cycle's energies use), so the
 * heat the network receives equals the copper + iron energy reported. The loss point of instant
 * k+1 is solved at the temperatures the network reaches at t_k+1 with the losses of instant k held
 * (a predictor; it differs from the temperatures finally reached by at most
 * |P(k+1) - P(k)| (t_k+1 - t_k) / (2 C) per node, C the node's heat capacity).
 *
 * Solving every instant ('every-instant') costs one loss point per instant. 'adaptive' solves only at
 * knots and interpolates linearly in between: a span from knot a to knot b (at most maxSpan
 * instants, doubling after each accepted span) is accepted when the interpolation error that the
 * second difference over the previous knot p, a and b predicts for the loss (copper + iron +
 * inverter) and for the current, |D| (t_b - t_a) / (4 (t_b - t_p)), is within `tolerance` relative
 * (of the larger end value; floors 1e-3 W and 1e-5 Imax) and a and b are on the same side of the
 * envelope's edge; otherwise the span is halved (down to one instant, where nothing is interpolated).
 * Between knots the mechanical loss is exact and the DC power is the shaft power plus the interpolated
 * losses (the balance the solved instants satisfy to the fixed point's tolerance). This is an
 * estimate, not a bound: an excursion shorter than a span that leaves no trace in the second
 * difference is not seen; 'every-instant' has none of this.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { LossConditions } from '../steady-state/point-losses';
import type { CycleInstants } from './duty-cycle-spec';
import { stepTemperatures } from '../machine/thermal-network';
import { mechanicalLoss } from '../machine/motor-losses';
import { IL, type InstantLossScratch, instantLosses, newInstantLossScratch } from './instant-losses';

const RPM = Math.PI / 30;

/** The per-instant arrays of a run (the last repeat's after the run). */
export interface CycleArrays {
  winding_C: Float64Array;
  stator_C: Float64Array;
  copper_W: Float64Array;
  iron_W: Float64Array;
  mechanical_W: Float64Array;
  inverter_W: Float64Array;
  dcPower_W: Float64Array;
  /** |i_dq|, A peak */
  current_A: Float64Array;
  lossTorque_Nm: Float64Array;
  /** index into OUTSIDE (instant-losses.ts): 0 inside the envelope */
  outside: Uint8Array;
  /** 1 where the loss point was solved, 0 where interpolated */
  solved: Uint8Array;
}

export interface PassSettings {
  adaptive: boolean;
  /** longest span between knots, instants (>= 1) */
  maxSpan: number;
  tolerance: number;
  /** also carry the network's own transition (no losses) for the periodic state */
  transition: boolean;
}

/** What a run keeps between repeats: its arrays and scratch. */
export interface CyclePass {
  readonly x: CycleInstants;
  readonly a: CycleArrays;
  readonly settings: PassSettings;
  readonly sc: InstantLossScratch;
  /** the predicted temperatures, and the network's transition carried as two states (see runPass) */
  readonly P: Float64Array;
  readonly U: Float64Array;
  readonly V: Float64Array;
}

export function newCyclePass(x: CycleInstants, peak: DriveLimits, settings: PassSettings): CyclePass {
  const N = x.t_s.length, f = () => new Float64Array(N);
  const a: CycleArrays = {
    winding_C: f(), stator_C: f(), copper_W: f(), iron_W: f(), mechanical_W: f(), inverter_W: f(), dcPower_W: f(),
    current_A: f(), lossTorque_Nm: f(), outside: new Uint8Array(N), solved: new Uint8Array(N),
  };
  return { x, a, settings, sc: newInstantLossScratch(peak), P: new Float64Array(2), U: new Float64Array(2), V: new Float64Array(2) };
}

export interface PassOutcome {
  /** heat removed to the coolant over the repeat, J */
  removed_J: number;
  /** loss points solved */
  solves: number;
  /** false when `tick` asked to stop */
  completed: boolean;
}

/**
 * One repeat from the temperatures T (winding, stator, °C; advanced in place to the end). With
 * settings.transition, phi receives the network's transition over the repeat (row-major 2 x 2: end =
 * phi (start - T_c) + T_c with no losses). tick(k) is called every 4096 instants or so; false stops.
 */
export function runPass(cp: CyclePass, tm: TemperatureModel, th: ThermalNetworkSpec, c: LossConditions, T: Float64Array, phi: Float64Array, tick: (k: number) => boolean): PassOutcome {
  const { x, a: A, settings: st, sc, P, U, V } = cp;
  const t = x.t_s, rpm = x.speed_rpm, tq = x.torque_Nm, N = t.length;
  const cu = A.copper_W, fe = A.iron_W, inv = A.inverter_W, cur = A.current_A, lt = A.lossTorque_Nm, out = A.outside;
  const Tc = th.coolantTemp_C;
  let solves = 0;
  const solve = (k: number, Tw: number, Ts: number): void => {
    const o = instantLosses(tm, th, c, sc, rpm[k]! * RPM, tq[k]!, Tw, Ts, k > 0 ? lt[k - 1]! : 0);
    cu[k] = o[IL.copper]!; fe[k] = o[IL.iron]!; A.mechanical_W[k] = o[IL.mechanical]!; inv[k] = o[IL.inverter]!;
    A.dcPower_W[k] = o[IL.dcPower]!; cur[k] = o[IL.current]!; lt[k] = o[IL.lossTorque]!; out[k] = o[IL.outside]!;
    A.solved[k] = 1;
    solves++;
  };
  U[0] = Tc + 1; U[1] = Tc; V[0] = Tc; V[1] = Tc + 1;
  A.winding_C[0] = T[0]!; A.stator_C[0] = T[1]!;
  solve(0, T[0]!, T[1]!);
  let removed = 0, ka = 0, kp = -1, h = 1, nextTick = 4096;
  const ImaxFloor = 1e-5 * sc.peakImax;
  while (ka < N - 1) {
    const kb = Math.min(ka + h, N - 1);
    P[0] = T[0]!; P[1] = T[1]!;
    stepTemperatures(th, P, cu[ka]!, fe[ka]!, rpm[ka]!, t[kb]! - t[ka]!);
    if (kb - ka > 1) lt[kb - 1] = lt[ka]!; // the fixed point's first guess
    solve(kb, P[0]!, P[1]!);
    if (kb - ka > 1) {
      let ok = out[kb] === out[ka] && kp >= 0;
      if (ok) {
        const ta = t[ka]!, r = (t[kb]! - ta) / (ta - t[kp]!), e = (t[kb]! - ta) / (4 * (t[kb]! - t[kp]!));
        const la = cu[ka]! + fe[ka]! + inv[ka]!, lb = cu[kb]! + fe[kb]! + inv[kb]!, lp = cu[kp]! + fe[kp]! + inv[kp]!;
        const eL = Math.abs(lb - la - (la - lp) * r) * e;
        const eI = Math.abs(cur[kb]! - cur[ka]! - (cur[ka]! - cur[kp]!) * r) * e;
        ok = eL <= st.tolerance * Math.max(la, lb, 1e-3) && eI <= st.tolerance * Math.max(cur[ka]!, cur[kb]!, ImaxFloor);
      }
      if (!ok) {
        A.solved[kb] = 0;
        h = Math.max(1, (kb - ka) >> 1);
        continue;
      }
      // interpolate the instants between the knots
      const ta = t[ka]!, span = t[kb]! - ta;
      for (let k = ka + 1; k < kb; k++) {
        const f = (t[k]! - ta) / span, g = 1 - f;
        cu[k] = g * cu[ka]! + f * cu[kb]!; fe[k] = g * fe[ka]! + f * fe[kb]!; inv[k] = g * inv[ka]! + f * inv[kb]!;
        cur[k] = g * cur[ka]! + f * cur[kb]!; lt[k] = g * lt[ka]! + f * lt[kb]!;
        out[k] = out[ka]!; A.solved[k] = 0;
        const w = rpm[k]! * RPM;
        const pm = mechanicalLoss(c.friction, c.losses.windage, w);
        A.mechanical_W[k] = pm;
        A.dcPower_W[k] = tq[k]! * w + cu[k]! + fe[k]! + pm + inv[k]!;
      }
    }
    // advance the network instant by instant over the accepted span
    for (let k = ka; k < kb; k++) {
      const dt = t[k + 1]! - t[k]!, s = 0.5 * (rpm[k]! + rpm[k + 1]!);
      removed += stepTemperatures(th, T, 0.5 * (cu[k]! + cu[k + 1]!), 0.5 * (fe[k]! + fe[k + 1]!), s, dt);
      A.winding_C[k + 1] = T[0]!; A.stator_C[k + 1] = T[1]!;
      if (st.transition) { stepTemperatures(th, U, 0, 0, s, dt); stepTemperatures(th, V, 0, 0, s, dt); }
    }
    kp = ka; ka = kb;
    h = st.adaptive ? Math.min(st.maxSpan, 2 * (kb - kp)) : 1;
    if (ka >= nextTick) {
      nextTick = ka + 4096;
      if (!tick(ka)) return { removed_J: removed, solves, completed: false };
    }
  }
  phi[0] = U[0]! - Tc; phi[1] = V[0]! - Tc; phi[2] = U[1]! - Tc; phi[3] = V[1]! - Tc;
  return { removed_J: removed, solves, completed: true };
}

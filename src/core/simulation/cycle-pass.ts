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
 * knots and interpolates linearly in between. A knot is placed at every kink of the cycle (where its
 * speed or torque changes slope, kinksOf). A span from knot a to knot b (at most maxSpan instants)
 * is accepted when a and b are on the same side of the envelope's edge and the estimated
 * interpolation error of the loss (copper + iron + inverter) and of the current is within
 * `tolerance` relative (to the larger end value, and at least to a tenth of the largest value met in
 * the run): from the second difference over the previous knot p, a and b,
 * |D| (t_b - t_a) / (4 (t_b - t_p)); on the first span after a kink, where there is no p, from the
 * midpoint solved as well. A rejected span shrinks (the error grows as its square), an accepted one
 * grows by up to 4. When the temperatures reached at b differ from the predicted ones by more than
 * tolerance / 0.01 K (the losses change by less than 1 %/K), b is solved again there and the span
 * integrated again. Between knots the mechanical loss is exact and the DC power is the shaft power
 * plus the interpolated losses (the balance the solved instants satisfy to the fixed point's
 * tolerance). This is an estimate, not a bound: an excursion between knots that leaves no trace in
 * the second difference is not seen; 'every-instant' has none of this.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { LossConditions } from '../steady-state/point-losses';
import type { CycleInstants } from './duty-cycle-spec';
import { stepTemperatures } from '../machine/thermal-network';
import { mechanicalLoss } from '../machine/motor-losses';
import { IL, instantLosses, newInstantLossScratch } from './instant-losses';

const RPM = Math.PI / 30;
/**
 * A bound on the losses' relative change per kelvin, 1/K (copper's 0.004 in the resistance, the
 * magnet's remanence in the current needed, rounded up): a knot solved at temperatures more than
 * tolerance / DRIFT_SENSITIVITY from those reached is solved again there.
 */
const DRIFT_SENSITIVITY = 0.01;
/** the interpolation's error is relative to the larger end value, and at least to this fraction of the largest value met so far */
const FLOOR = 0.1;

/** Fill the instants between knots ka and kb by linear interpolation (mechanical loss exact, DC power by the balance). */
function interpolate(cp: CyclePass, c: LossConditions, ka: number, kb: number): void {
  const A = cp.a, t = cp.x.t_s, rpm = cp.x.speed_rpm, tq = cp.x.torque_Nm;
  const cu = A.copper_W, fe = A.iron_W, inv = A.inverter_W, cur = A.current_A, lt = A.lossTorque_Nm;
  const ta = t[ka]!, span = t[kb]! - ta;
  for (let k = ka + 1; k < kb; k++) {
    const f = (t[k]! - ta) / span, g = 1 - f;
    cu[k] = g * cu[ka]! + f * cu[kb]!; fe[k] = g * fe[ka]! + f * fe[kb]!; inv[k] = g * inv[ka]! + f * inv[kb]!;
    cur[k] = g * cur[ka]! + f * cur[kb]!; lt[k] = g * lt[ka]! + f * lt[kb]!;
    A.outside[k] = A.outside[ka]!; A.solved[k] = 0;
    const w = rpm[k]! * RPM;
    const pm = mechanicalLoss(c.friction, c.losses.windage, w);
    A.mechanical_W[k] = pm;
    A.dcPower_W[k] = tq[k]! * w + cu[k]! + fe[k]! + pm + inv[k]!;
  }
}

/** Advance T over instants ka..kb, the trapezoid mean of the losses held over each interval; returns the heat removed, J. */
function advance(cp: CyclePass, th: ThermalNetworkSpec, T: Float64Array, ka: number, kb: number, transition: boolean): number {
  const A = cp.a, t = cp.x.t_s, rpm = cp.x.speed_rpm, cu = A.copper_W, fe = A.iron_W;
  let removed = 0;
  for (let k = ka; k < kb; k++) {
    const dt = t[k + 1]! - t[k]!, s = 0.5 * (rpm[k]! + rpm[k + 1]!);
    removed += stepTemperatures(th, T, 0.5 * (cu[k]! + cu[k + 1]!), 0.5 * (fe[k]! + fe[k + 1]!), s, dt);
    A.winding_C[k + 1] = T[0]!; A.stator_C[k + 1] = T[1]!;
    if (transition) { stepTemperatures(th, cp.U, 0, 0, s, dt); stepTemperatures(th, cp.V, 0, 0, s, dt); }
  }
  return removed;
}

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
  /** the peak limits (an instant beyond them is outside the envelope) */
  readonly peak: DriveLimits;
  /** the predicted temperatures, and the network's transition carried as two states (see runPass) */
  readonly P: Float64Array;
  /** the temperatures at the span's start */
  readonly T0: Float64Array;
  /** the largest loss (copper + iron + inverter) and current solved so far in the run */
  readonly big: Float64Array;
  readonly U: Float64Array;
  readonly V: Float64Array;
  /** 1 where the cycle's speed or torque changes slope (a knot is placed there) */
  readonly kink: Uint8Array;
  /** the first kink after each instant (the last instant when none) */
  readonly nextKink: Int32Array;
}

export function newCyclePass(x: CycleInstants, peak: DriveLimits, settings: PassSettings): CyclePass {
  const N = x.t_s.length, f = () => new Float64Array(N);
  const a: CycleArrays = {
    winding_C: f(), stator_C: f(), copper_W: f(), iron_W: f(), mechanical_W: f(), inverter_W: f(), dcPower_W: f(),
    current_A: f(), lossTorque_Nm: f(), outside: new Uint8Array(N), solved: new Uint8Array(N),
  };
  const { kink, nextKink } = kinksOf(x);
  return {
    x, a, settings, peak, P: new Float64Array(2), T0: new Float64Array(2), big: new Float64Array(2),
    U: new Float64Array(2), V: new Float64Array(2), kink, nextKink,
  };
}

/**
 * The instants where the cycle's speed or torque changes slope by more than 1e-9 of its largest
 * magnitude per second (rounding leaves far less). A cycle with kinks at more than one instant in
 * eight (measured, noisy data) is left to the error estimate alone: none are marked.
 */
export function kinksOf(x: CycleInstants): { kink: Uint8Array; nextKink: Int32Array } {
  const t = x.t_s, N = t.length, kink = new Uint8Array(N), nextKink = new Int32Array(N);
  let count = 0;
  for (const v of [x.speed_rpm, x.torque_Nm]) {
    let big = 0;
    for (let k = 0; k < N; k++) big = Math.max(big, Math.abs(v[k]!));
    for (let k = 1; k < N - 1; k++) {
      const s0 = (v[k]! - v[k - 1]!) / (t[k]! - t[k - 1]!), s1 = (v[k + 1]! - v[k]!) / (t[k + 1]! - t[k]!);
      if (Math.abs(s1 - s0) * (t[k + 1]! - t[k - 1]!) > 1e-9 * (big + 1) && kink[k] === 0) { kink[k] = 1; count++; }
    }
  }
  if (count * 8 > N) kink.fill(0);
  let next = N - 1;
  for (let k = N - 1; k >= 0; k--) { nextKink[k] = next; if (kink[k] === 1) next = k; }
  return { kink, nextKink };
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
  const { x, a: A, settings: st, P, T0, U, V, big } = cp;
  const sc = newInstantLossScratch(tm, th, c, cp.peak); // the pass's evaluator (it owns tm)
  const t = x.t_s, rpm = x.speed_rpm, tq = x.torque_Nm, N = t.length;
  const cu = A.copper_W, fe = A.iron_W, inv = A.inverter_W, cur = A.current_A, lt = A.lossTorque_Nm, out = A.outside;
  const Tc = th.coolantTemp_C;
  let solves = 0;
  const solve = (k: number, Tw: number, Ts: number): void => {
    const o = instantLosses(sc, rpm[k]! * RPM, tq[k]!, Tw, Ts, k > 0 ? lt[k - 1]! : 0);
    cu[k] = o[IL.copper]!; fe[k] = o[IL.iron]!; A.mechanical_W[k] = o[IL.mechanical]!; inv[k] = o[IL.inverter]!;
    A.dcPower_W[k] = o[IL.dcPower]!; cur[k] = o[IL.current]!; lt[k] = o[IL.lossTorque]!; out[k] = o[IL.outside]!;
    A.solved[k] = 1;
    solves++;
    const l = cu[k]! + fe[k]! + inv[k]!;
    if (l > big[0]!) big[0] = l;
    if (cur[k]! > big[1]!) big[1] = cur[k]!;
  };
  U[0] = Tc + 1; U[1] = Tc; V[0] = Tc; V[1] = Tc + 1;
  A.winding_C[0] = T[0]!; A.stator_C[0] = T[1]!;
  solve(0, T[0]!, T[1]!);
  let removed = 0, ka = 0, kp = -1, h = 1, nextTick = 4096;
  const ImaxFloor = 1e-5 * cp.peak.Imax;
  // the knot's temperatures may miss the ones reached by this much before it is solved again there
  const driftK = st.tolerance / DRIFT_SENSITIVITY;
  const lossAt = (k: number): number => cu[k]! + fe[k]! + inv[k]!;
  /** an interpolation error of loss eL and current eI at knots ka, kb over the tolerance */
  const ratio = (eL: number, eI: number, ka: number, kb: number): number =>
    Math.max(eL / Math.max(lossAt(ka), lossAt(kb), FLOOR * big[0]!, 1e-3), eI / Math.max(cur[ka]!, cur[kb]!, FLOOR * big[1]!, ImaxFloor)) / st.tolerance;
  const predict = (ka: number, kb: number): void => {
    P[0] = T[0]!; P[1] = T[1]!;
    stepTemperatures(th, P, cu[ka]!, fe[ka]!, rpm[ka]!, t[kb]! - t[ka]!);
    if (kb - ka > 1) lt[kb - 1] = lt[ka]!; // the fixed point's first guess
    solve(kb, P[0]!, P[1]!);
  };
  while (ka < N - 1) {
    const kb = Math.min(ka + h, N - 1, st.adaptive ? cp.nextKink[ka]! : N);
    let q = 0, km = -1; // q: the estimated interpolation error over the tolerance; km: a midpoint knot
    if (kb - ka > 1 && kp < 0) {
      // the first span of a piece: its midpoint solved too
      km = (ka + kb) >> 1;
      predict(ka, km);
    }
    predict(ka, kb);
    if (kb - ka > 1) {
      if (out[kb] !== out[ka] || (km >= 0 && out[km] !== out[ka])) q = Infinity;
      else if (km >= 0) {
        const f = (t[km]! - t[ka]!) / (t[kb]! - t[ka]!), g = 1 - f;
        q = ratio(Math.abs(lossAt(km) - g * lossAt(ka) - f * lossAt(kb)), Math.abs(cur[km]! - g * cur[ka]! - f * cur[kb]!), ka, kb);
      } else {
        // linear interpolation's error from the second difference over knots kp, ka, kb
        const ta = t[ka]!, r = (t[kb]! - ta) / (ta - t[kp]!), e = (t[kb]! - ta) / (4 * (t[kb]! - t[kp]!));
        const la = lossAt(ka);
        q = ratio(Math.abs(lossAt(kb) - la - (la - lossAt(kp)) * r) * e, Math.abs(cur[kb]! - cur[ka]! - (cur[ka]! - cur[kp]!) * r) * e, ka, kb);
      }
      if (!(q <= 1)) {
        A.solved[kb] = 0;
        if (km >= 0) A.solved[km] = 0;
        // the error of linear interpolation grows as the span squared
        h = Math.max(1, Math.min((kb - ka) >> 1, Math.floor((kb - ka) * Math.max(0.2, 0.9 / Math.sqrt(q)))));
        continue;
      }
      if (km >= 0) { interpolate(cp, c, ka, km); interpolate(cp, c, km, kb); }
      else interpolate(cp, c, ka, kb);
    }
    // advance the network instant by instant over the accepted span
    T0[0] = T[0]!; T0[1] = T[1]!;
    let heat = advance(cp, th, T, ka, kb, st.transition);
    if (kb - ka > 1 && Math.max(Math.abs(T[0]! - P[0]!), Math.abs(T[1]! - P[1]!)) > driftK) {
      // the knot was solved too far from the temperatures reached: once more there, and the span again
      solve(kb, T[0]!, T[1]!);
      interpolate(cp, c, km >= 0 ? km : ka, kb);
      T[0] = T0[0]!; T[1] = T0[1]!;
      heat = advance(cp, th, T, ka, kb, false);
    }
    removed += heat;
    const span = kb - ka;
    kp = cp.kink[kb] === 1 ? -1 : km >= 0 ? km : ka; // a kink of the cycle starts a new piece
    ka = kb;
    h = !st.adaptive ? 1 : Math.min(st.maxSpan, Math.max(span + 1, Math.floor(span * (q > 0 ? Math.min(4, 0.9 / Math.sqrt(q)) : 2))));
    if (ka >= nextTick) {
      nextTick = ka + 4096;
      if (!tick(ka)) return { removed_J: removed, solves, completed: false };
    }
  }
  phi[0] = U[0]! - Tc; phi[1] = V[0]! - Tc; phi[2] = U[1]! - Tc; phi[3] = V[1]! - Tc;
  return { removed_J: removed, solves, completed: true };
}

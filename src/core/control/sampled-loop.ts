/**
 * The exact sampled-data loops, as the controller runs them (see controller.ts), evaluated on the unit
 * circle z = e^{j omega T} up to the Nyquist frequency.
 *
 * - PI in the controller's discrete form: u[k] = Kp e[k] + x[k], x[k+1] = x[k] + Ki T e[k], so
 *   C(z) = Kp + Ki T / (z - 1).
 * - The voltage computed at sample k is applied d periods later and held over one period (zero-order
 *   hold): z^-d.
 * - Current plant 1/(R + sL) under the hold: its ZOH equivalent b/(z - a), a = e^{-R T/L},
 *   b = (1 - a)/R (Franklin, Powell and Workman, 1998, Digital Control of Dynamic Systems, ZOH
 *   equivalent of a first-order lag).
 * - Speed loop: the q-axis current loop closed at the control rate, the winding and the mechanics
 *   1/(J s + B) discretised together under the held voltage (the shaft integrates the current between
 *   samples, not only its samples), the torque reference held over `divider` control periods and the
 *   speed sampled at the speed-loop rate (the current loop lifted to the speed-loop period), and the
 *   speed PI in discrete form at T_speed = divider·T. As in tuning.ts, the torque-producing current is
 *   counted in torque units (the torque constant cancels between reference and plant) and the
 *   back-EMF is taken as cancelled by its feed-forward.
 *
 * Margins: gain crossover, phase margin, gain margin, closed-loop -3 dB bandwidth and closed-loop
 * peaking max |L/(1+L)|, found on a dense logarithmic grid of theta = omega T up to pi (the phase
 * unwrapped along the grid, anchored at the lowest frequency to a known branch), then bisection.
 */

/** A discrete loop's value at z = e^{j theta}: writes re, im into out. */
export type SampledResponse = (theta: number, out: Float64Array) => void;

/** ZOH equivalent of 1/(R + sL) over a period T: b/(z - a). */
export function zohFirstOrder(R: number, L: number, T: number): { a: number; b: number } {
  const x = (R * T) / L;
  const a = Math.exp(-x);
  // b = (1 - e^{-RT/L})/R, with its limit T/L at R = 0
  const b = R === 0 ? T / L : -Math.expm1(-x) / R;
  return { a, b };
}

/**
 * Phi = e^{A T} and Gamma = integral_0^T e^{A s} ds B for a small dense system (scaling and squaring
 * of the augmented matrix [[A, B], [0, 0]], Taylor series to 20 terms).
 */
export function zohStateSpace(A: number[][], B: number[], T: number): { Phi: number[][]; Gamma: number[] } {
  const n = A.length;
  const m = n + 1;
  const M: number[][] = Array.from({ length: m }, (_, i) => Array.from({ length: m }, (__, j) => (i < n ? (j < n ? A[i]![j]! : B[i]!) * T : 0)));
  let norm = 0;
  for (const row of M) norm = Math.max(norm, row.reduce((s, v) => s + Math.abs(v), 0));
  const sq = Math.max(0, Math.ceil(Math.log2(norm / 0.25)));
  const scale = Math.pow(2, -sq);
  const X = M.map((r) => r.map((v) => v * scale));
  const mul = (P: number[][], Q: number[][]): number[][] =>
    P.map((r, i) => Q[0]!.map((_, j) => r.reduce((s, v, k) => s + v * Q[k]![j]!, 0 * i)));
  let E: number[][] = Array.from({ length: m }, (_, i) => Array.from({ length: m }, (__, j) => (i === j ? 1 : 0)));
  let term = E.map((r) => r.slice());
  for (let k = 1; k <= 20; k++) {
    term = mul(term, X).map((r) => r.map((v) => v / k));
    E = E.map((r, i) => r.map((v, j) => v + term[i]![j]!));
  }
  for (let k = 0; k < sq; k++) E = mul(E, E);
  return { Phi: E.slice(0, n).map((r) => r.slice(0, n)), Gamma: E.slice(0, n).map((r) => r[n]!) };
}

/** Open loop of one current axis: (Kp + Ki T/(z-1)) z^-d b/(z - a). */
export function sampledCurrentOpenLoop(Kp: number, Ki: number, R: number, L: number, T: number, delaySamples: number): SampledResponse {
  const { a, b } = zohFirstOrder(R, L, T);
  const KiT = Ki * T;
  return (theta, out) => {
    const c = Math.cos(theta);
    const s = Math.sin(theta);
    // PI: Kp + KiT/(z-1); 1/(z-1) = (c-1 - j s)/((c-1)^2 + s^2)
    // c - 1 = -2 sin²(theta/2), exact at small theta
    const sh = Math.sin(theta / 2);
    const cm1 = -2 * sh * sh;
    const d1 = cm1 * cm1 + s * s;
    const pr = Kp + (KiT * cm1) / d1;
    const pi = (-KiT * s) / d1;
    // plant b/(z-a)
    const d2 = (c - a) * (c - a) + s * s;
    const gr = (b * (c - a)) / d2;
    const gi = (-b * s) / d2;
    // delay e^{-j d theta}
    const dr = Math.cos(delaySamples * theta);
    const di = -Math.sin(delaySamples * theta);
    const xr = pr * gr - pi * gi;
    const xi = pr * gi + pi * gr;
    out[0] = xr * dr - xi * di;
    out[1] = xr * di + xi * dr;
  };
}

export interface SampledSpeedLoopSpec {
  /** q-axis current PI */
  currentKp: number;
  currentKi: number;
  R: number;
  /** q-axis inductance, H */
  L: number;
  /** total inertia, kg·m² */
  J: number;
  /** viscous friction, N·m·s/rad */
  B: number;
  /** control period, s */
  T: number;
  delaySamples: number;
  /** speed loop every this many control periods */
  divider: number;
  speedKp: number;
  speedKi: number;
}

/**
 * Open loop of the speed loop at the speed-loop rate: (Kp + Ki Tw/(zw - 1)) P(zw), P the lifted
 * closed current loop and mechanics, from the held torque reference to the sampled speed.
 */
export function sampledSpeedOpenLoop(sp: SampledSpeedLoopSpec): SampledResponse {
  const D = sp.delaySamples;
  // plant [i, omega] under the held voltage; torque constant 1 (see the header)
  const { Phi, Gamma } = zohStateSpace(
    [
      [-sp.R / sp.L, 0],
      [1 / sp.J, -sp.B / sp.J],
    ],
    [1 / sp.L, 0],
    sp.T,
  );
  // closed inner loop at the control rate: x = [i, omega, xi, s1..sD], input the current reference r
  const n = 3 + D;
  const Af: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const Bf = new Array<number>(n).fill(0);
  const KiT = sp.currentKi * sp.T;
  // v = Kp (r - i) + xi; u = D ? s_D : v
  const uRow = new Array<number>(n).fill(0);
  let uR = 0;
  if (D === 0) {
    uRow[0] = -sp.currentKp;
    uRow[2] = 1;
    uR = sp.currentKp;
  } else uRow[2 + D] = 1;
  for (let r = 0; r < 2; r++) {
    Af[r]![0] = Phi[r]![0]!;
    Af[r]![1] = Phi[r]![1]!;
    for (let j = 0; j < n; j++) Af[r]![j] = Af[r]![j]! + Gamma[r]! * uRow[j]!;
    Bf[r] = Gamma[r]! * uR;
  }
  // xi+ = xi + KiT (r - i)
  Af[2]![2] = 1;
  Af[2]![0] = -KiT;
  Bf[2] = KiT;
  if (D > 0) {
    // s1+ = v, s_j+ = s_{j-1}
    Af[3]![0] = -sp.currentKp;
    Af[3]![2] = 1;
    Bf[3] = sp.currentKp;
    for (let j = 2; j <= D; j++) Af[2 + j]![2 + j - 1] = 1;
  }
  // lift over `divider` periods with the reference held: Aw = Af^N, Bw = sum Af^k Bf
  let Aw: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (__, j) => (i === j ? 1 : 0)));
  let Bw = new Array<number>(n).fill(0);
  for (let k = 0; k < sp.divider; k++) {
    Bw = Af.map((row, i) => row.reduce((s, v, j) => s + v * Bw[j]!, 0) + Bf[i]!);
    Aw = Af.map((row) => Aw[0]!.map((_, j) => row.reduce((s, v, l) => s + v * Aw[l]![j]!, 0)));
  }
  const KiTw = sp.speedKi * sp.T * sp.divider;
  // complex solve (zI - Aw) x = Bw, output x[1] (the speed); preallocated workspace, Aw and Bw as flat copies
  const AwF = Float64Array.from(Aw.flat());
  const BwF = Float64Array.from(Bw);
  const Mr = new Float64Array(n * n), Mi = new Float64Array(n * n);
  const vr = new Float64Array(n), vi = new Float64Array(n);
  const z = new Float64Array(2);
  return (theta, out) => {
    z[0] = Math.cos(theta); z[1] = Math.sin(theta); // z = e^{j theta}
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        Mr[i * n + j] = (i === j ? z[0]! : 0) - AwF[i * n + j]!;
        Mi[i * n + j] = i === j ? z[1]! : 0;
      }
      vr[i] = BwF[i]!;
      vi[i] = 0;
    }
    // Gaussian elimination with partial pivoting
    for (let c = 0; c < n; c++) {
      let p = c;
      let best = -1;
      for (let r = c; r < n; r++) {
        const m = Math.hypot(Mr[r * n + c]!, Mi[r * n + c]!);
        if (m > best) { best = m; p = r; }
      }
      if (p !== c) {
        for (let j = 0; j < n; j++) {
          let t = Mr[c * n + j]!; Mr[c * n + j] = Mr[p * n + j]!; Mr[p * n + j] = t;
          t = Mi[c * n + j]!; Mi[c * n + j] = Mi[p * n + j]!; Mi[p * n + j] = t;
        }
        let t = vr[c]!; vr[c] = vr[p]!; vr[p] = t;
        t = vi[c]!; vi[c] = vi[p]!; vi[p] = t;
      }
      const pr = Mr[c * n + c]!;
      const pim = Mi[c * n + c]!;
      const pd = pr * pr + pim * pim;
      for (let r = c + 1; r < n; r++) {
        const ar = Mr[r * n + c]!;
        const ai = Mi[r * n + c]!;
        if (ar === 0 && ai === 0) continue;
        // f = a / pivot
        const fr = (ar * pr + ai * pim) / pd;
        const fi = (ai * pr - ar * pim) / pd;
        for (let j = c; j < n; j++) {
          const br = Mr[c * n + j]!;
          const bi = Mi[c * n + j]!;
          Mr[r * n + j] = Mr[r * n + j]! - (fr * br - fi * bi);
          Mi[r * n + j] = Mi[r * n + j]! - (fr * bi + fi * br);
        }
        const br = vr[c]!;
        const bi = vi[c]!;
        vr[r] = vr[r]! - (fr * br - fi * bi);
        vi[r] = vi[r]! - (fr * bi + fi * br);
      }
    }
    for (let r = n - 1; r >= 0; r--) {
      let sr = vr[r]!;
      let si = vi[r]!;
      for (let j = r + 1; j < n; j++) {
        sr -= Mr[r * n + j]! * vr[j]! - Mi[r * n + j]! * vi[j]!;
        si -= Mr[r * n + j]! * vi[j]! + Mi[r * n + j]! * vr[j]!;
      }
      const dr = Mr[r * n + r]!;
      const di = Mi[r * n + r]!;
      const dd = dr * dr + di * di;
      vr[r] = (sr * dr + si * di) / dd;
      vi[r] = (si * dr - sr * di) / dd;
    }
    const Pr = vr[1]!;
    const Pi = vi[1]!;
    // speed PI: Kp + KiTw/(z-1)
    const sh = Math.sin(theta / 2);
    const c = -2 * sh * sh;
    const s = z[1]!;
    const d1 = c * c + s * s;
    const cr = sp.speedKp + (KiTw * c) / d1;
    const ci = (-KiTw * s) / d1;
    out[0] = cr * Pr - ci * Pi;
    out[1] = cr * Pi + ci * Pr;
  };
}

export interface SampledMargins {
  crossover_Hz: number | null;
  phaseMargin_deg: number | null;
  gainMargin_dB: number | null;
  bandwidth_Hz: number | null;
  /** largest closed-loop gain |L/(1+L)| over frequency up to Nyquist, dB (0 dB or more) */
  peaking_dB: number | null;
}

/** Points of the scan grid from the lowest frequency to Nyquist. */
export const SAMPLED_GRID_POINTS = 3000;

/**
 * A response with its phase unwrapped along a logarithmic grid of theta in [thetaLo, pi], anchored so
 * that the phase at thetaLo lies within pi of `anchorPhase` (rad, a known branch at that frequency).
 */
export class UnwrappedResponse {
  readonly theta: Float64Array;
  readonly mag: Float64Array;
  readonly phase: Float64Array;
  /** the response's real and imaginary parts at the grid points (the margins read them instead of evaluating again) */
  readonly re: Float64Array;
  readonly im: Float64Array;
  private readonly o = new Float64Array(2);
  constructor(readonly resp: SampledResponse, thetaLo: number, anchorPhase: number, n = SAMPLED_GRID_POINTS) {
    const theta = (this.theta = new Float64Array(n)), mag = (this.mag = new Float64Array(n)), phase = (this.phase = new Float64Array(n));
    const re = (this.re = new Float64Array(n)), im = (this.im = new Float64Array(n)), o = this.o;
    const r = Math.log(Math.PI / thetaLo);
    let prev = anchorPhase;
    for (let k = 0; k < n; k++) {
      const th = k === n - 1 ? Math.PI : thetaLo * Math.exp((r * k) / (n - 1));
      resp(th, o);
      const x = o[0]!, y = o[1]!;
      theta[k] = th;
      re[k] = x; im[k] = y;
      mag[k] = Math.hypot(x, y);
      const ph = near(Math.atan2(y, x), prev);
      phase[k] = ph;
      prev = ph;
    }
  }
  /** magnitude and phase (on the branch near `ref`) at theta */
  at(theta: number, ref: number): [number, number] {
    this.resp(theta, this.o);
    return [Math.hypot(this.o[0]!, this.o[1]!), near(Math.atan2(this.o[1]!, this.o[0]!), ref)];
  }
  /** first grid interval where g(theta, k) (k the interval start) goes from >= 0 to < 0, refined by bisection; at grid point k > 0 g is grid[k] - shift (the stored values) */
  firstDown(g: (theta: number, k: number) => number, grid: Float64Array, shift = 0): number | null {
    const n = this.theta.length;
    let ga = g(this.theta[0]!, 0);
    for (let k = 1; k < n; k++) {
      const gb = grid[k]! - shift;
      if (ga >= 0 && gb < 0) {
        let lo = this.theta[k - 1]!;
        let hi = this.theta[k]!;
        for (let i = 0; i < 60; i++) {
          const mid = Math.sqrt(lo * hi);
          if (g(mid, k - 1) >= 0) lo = mid; else hi = mid;
        }
        return Math.sqrt(lo * hi);
      }
      ga = gb;
    }
    return null;
  }
}

/** x + 2 pi m nearest to ref */
function near(x: number, ref: number): number {
  return x + 2 * Math.PI * Math.round((ref - x) / (2 * Math.PI));
}

function foldDeg(x: number): number {
  let y = x % 360;
  if (y <= -180) y += 360;
  if (y > 180) y -= 360;
  return y;
}

/** Margins of a sampled loop of period T (see the header). */
export function sampledMargins(u: UnwrappedResponse, T: number): SampledMargins {
  const toHz = (th: number): number => th / (2 * Math.PI * T);
  const o = new Float64Array(2);
  const closedOf = (re: number, im: number): number => Math.hypot(re, im) / Math.hypot(1 + re, im);
  // the scanned functions at the grid points, from the stored response: log gain, phase + pi, closed-loop gain
  const n = u.theta.length, logMag = new Float64Array(n), ph180 = new Float64Array(n), cl = new Float64Array(n);
  for (let k = 0; k < n; k++) { logMag[k] = Math.log(u.mag[k]!); ph180[k] = u.phase[k]! + Math.PI; cl[k] = closedOf(u.re[k]!, u.im[k]!); }
  const thc = u.firstDown((th, k) => Math.log(u.at(th, u.phase[k]!)[0]), logMag);
  let th180 = u.firstDown((th, k) => u.at(th, u.phase[k]!)[1] + Math.PI, ph180);
  const last = n - 1;
  // a loop whose phase reaches -180° exactly at Nyquist (no delay): the gain margin is read there
  if (th180 === null && Math.abs(u.phase[last]! + Math.PI) < 1e-9) th180 = Math.PI;
  const closed = (th: number): number => { u.resp(th, o); return closedOf(o[0]!, o[1]!); };
  const thb = u.firstDown((th) => closed(th) - Math.SQRT1_2, cl, Math.SQRT1_2);
  // closed-loop peak: grid maximum refined by golden-section search between its neighbours
  let kMax = 0;
  let cMax = -Infinity;
  for (let k = 0; k < n; k++) {
    const c = cl[k]!;
    if (c > cMax) { cMax = c; kMax = k; }
  }
  let lo = u.theta[Math.max(0, kMax - 1)]!;
  let hi = u.theta[Math.min(last, kMax + 1)]!;
  const gr = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 60; i++) {
    const x1 = hi - gr * (hi - lo);
    const x2 = lo + gr * (hi - lo);
    if (closed(x1) > closed(x2)) hi = x2; else lo = x1;
  }
  cMax = Math.max(cMax, closed((lo + hi) / 2));
  const fin = (x: number): number | null => (Number.isFinite(x) ? x : null);
  let pm = NaN;
  if (thc !== null) {
    const k = nearestIndex(u.theta, thc);
    pm = foldDeg(180 + (u.at(thc, u.phase[k]!)[1] * 180) / Math.PI);
    // the phase reaches -180° below the gain crossover: the loop is unstable, the margin negative
    if (th180 !== null && th180 < thc && pm > 0) pm -= 360;
  }
  const gm = th180 === null ? NaN : -20 * Math.log10(u.at(th180, 0)[0]);
  return {
    crossover_Hz: thc === null ? null : toHz(thc),
    phaseMargin_deg: thc === null ? null : fin(pm),
    gainMargin_dB: th180 === null ? null : fin(gm),
    bandwidth_Hz: thb === null ? null : toHz(thb),
    peaking_dB: fin(20 * Math.log10(cMax)),
  };
}

function nearestIndex(a: Float64Array, x: number): number {
  let lo = 0;
  let hi = a.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (a[mid]! <= x) lo = mid; else hi = mid;
  }
  return lo;
}

/** Bode data of a sampled loop from fLo to Nyquist, the phase on the unwrapped branch. */
export function sampledBode(u: UnwrappedResponse, T: number, fLo: number, n: number): { f_Hz: number[]; mag_dB: number[]; phase_deg: number[] } {
  const fNyq = 1 / (2 * T);
  const f_Hz: number[] = [];
  const mag_dB: number[] = [];
  const phase_deg: number[] = [];
  for (let k = 0; k < n; k++) {
    const f = k === n - 1 ? fNyq : fLo * Math.pow(fNyq / fLo, k / (n - 1));
    const th = Math.min(Math.PI, 2 * Math.PI * f * T);
    const [m, p] = u.at(th, u.phase[nearestIndex(u.theta, th)]!);
    f_Hz.push(f);
    mag_dB.push(20 * Math.log10(m));
    phase_deg.push((p * 180) / Math.PI);
  }
  return { f_Hz, mag_dB, phase_deg };
}

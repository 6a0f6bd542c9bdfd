/**
 * The switching bridge over a carrier period: the period split at the switching instants of the
 * three legs and the plant integrated across the segments with the phase voltages of each switching
 * state. A symmetric (triangular) carrier with its valley at the period's ends: the rising half
 * (valley to peak) holds the legs' turn-on edges at (1 - d) Tc/2, the falling half (peak to valley)
 * their turn-off edges at (1 + d) Tc/2; `half` integrates one of the two, so that a control update
 * may come at the peak and at the valley (two per period) or at the valley only (one).
 *
 * Dead time td: a commanded edge turns the conducting device off at once and the other device of the
 * leg on td later; in between the leg follows the diode that conducts, which the sign of the leg's
 * phase current at the commanded edge decides (the state integrated up to that edge, or, for a
 * constant-parameter machine, the current at the segment's start when it cannot reach zero by then):
 *   - turn-on command (to the plus rail): a current into the leg (i < -zeroCurrent) already flows in
 *     the upper diode, the leg rises at once; otherwise (i > 0, lower diode) it rises td later;
 *   - turn-off: a current out of the leg (i > zeroCurrent) moves to the lower diode at once;
 *     otherwise it stays on the upper diode for td.
 * Near zero current (|i| <= zeroCurrent) the leg stays for td on the side it was on (the diode of
 * the device that turned off), so such a pulse is delayed by td, its width unchanged: no mean
 * voltage error at zero current. A pulse shorter than the dead time vanishes (its turn-off command
 * cancels a turn-on still waiting). The mean leg error is -sgn(i) Vdc td / Tc (Murai, Watanabe,
 * Iwasaki 1987, "Waveform distortion and correction circuit for PWM inverters with switching
 * lag-times", IEEE Trans. Industry Applications IA-23(5)).
 *
 * Compensation (PwmSpec.compensation): each leg's duty moved by compensatedDuty (pwm-modulator.ts)
 * for its current's sign at the period's start; the probe keeps the modulator's duty as commanded.
 * Device drop: a leg sits at its rail minus deviceDrop sgn(i) (switch or diode conducting), the
 * sign at each segment's start, linear across |i| <= zeroCurrent (common practice, no source).
 *
 * Segments: a Stepper (stepper.ts; Cash-Karp, any machine) or, for a constant-parameter machine,
 * the exact segment (switching-segment.ts), one RK4 step where it declines. The probe accumulates,
 * until `resetProbe`, the phase currents at every segment boundary (the extremes of a piecewise-
 * smooth ripple), the legs' actual and commanded volt-seconds and the integrals of the DC-link
 * current i_dc = sum s_x i_x and of its square (linear within a segment). Allocation-free.
 */
import type { PwmSpec } from '../drive/pwm-spec';
import type { Plant } from './plant';
import { Rk4Stepper, type Stepper } from './stepper';
import { nextLoadBreak } from './load-schedule';
import type { ExactSegment } from './switching-segment';
import type { WindowTrace } from './switching-capture';
import { cosSmall, sinSmall } from '../mathematics/rotation';
import { compensatedDuty, switchingStateTable } from '../drive/pwm-modulator';

const SQRT3_2 = Math.sqrt(3) / 2;
const INV_SQRT3 = 1 / Math.sqrt(3);
/** boundary samples the probe keeps between two resets */
export const PROBE_CAPACITY = 128;

export class SwitchingPeriod {
  /** actual leg states: 1 = the leg is on the plus rail (upper switch or diode conducting) */
  readonly on = new Uint8Array(3);
  /** the comparator's command per leg */
  private readonly cmd = new Uint8Array(3);
  /** a delayed edge per leg (Infinity = none) and the state it sets */
  private readonly pendT = new Float64Array(3).fill(Infinity);
  private readonly pendS = new Uint8Array(3);
  private readonly edgeT = new Float64Array(3);
  /** phase currents a, b, c at the present time */
  readonly iph = new Float64Array(3);
  private readonly yc: Float64Array;
  // the probe
  /** boundary samples since the last reset: times and phase currents (a, b, c interleaved) */
  nb = 0;
  readonly tb = new Float64Array(PROBE_CAPACITY);
  readonly ib = new Float64Array(3 * PROBE_CAPACITY);
  /** integral of each leg's voltage (against the bus minus) since the reset, V·s */
  readonly legVs = new Float64Array(3);
  /** the same integral as commanded (d Vdc per half period, no dead time, no drop), V·s */
  readonly cmdVs = new Float64Array(3);
  /** integrals of the DC-link current and of its square since the reset, A·s and A²·s */
  idcInt = 0;
  idcSqInt = 0;
  /** time accumulated since the reset, s */
  span = 0;
  /** the probe accumulates (false: a period nobody reads, its probe skipped; `resetProbe` turns it on) */
  probing = true;
  /** segments integrated in all (for statistics) */
  segments = 0;
  /** full-resolution traces at every segment end within the window (null: none kept) */
  window: WindowTrace | null = null;

  private readonly Vdc: number = NaN;
  private readonly td: number = NaN;
  private readonly drop: number = NaN;
  private readonly i0: number = NaN;
  /** dead-time compensation (PwmSpec.compensation): its band, A (0: off), and each leg's current sign at the period's start */
  private readonly compBand: number = NaN;
  private readonly compSign = new Float64Array(3);
  /** the time the state is at while a segment is open (NaN: closed, the state at the last half's end) */
  private tOpen = NaN;
  /** the bound on the phase currents' rate of change for this half (see slewBound), A/s */
  private slew = Infinity;
  /** one RK4 step per segment (constant-parameter machines; see switching-stepper.ts), else the inner stepper */
  private readonly rk4: boolean;
  /** times handed between the methods below through a typed array (no boxed arguments): tv[0] the time of the step at hand */
  private readonly tv = new Float64Array(1);
  /** the half carrier period of `halfAt`: [hs[0], hs[1]] */
  private readonly hs = new Float64Array(2);
  /** the next load breakpoint, and the breakpoint ending the piece the plant's load was last set for */
  private nextBreak = -Infinity;
  private loadKey = NaN;
  /** a half carrier period, s (for slewBound) */
  private readonly Th: number = NaN;
  /** each switching state's voltages with the device drop for each pattern of the currents' signs (switchingStateTable) */
  private readonly svt = new Float64Array(320);

  /**
   * `inner` integrates the segments; an Rk4Stepper is driven one step per segment directly (its
   * substeps ignored), any other through its `period`. With `exact` (and an Rk4Stepper) each
   * segment goes to the exact segment first, RK4 where that declines.
   */
  constructor(private readonly plant: Plant, private readonly inner: Stepper, spec: Pick<PwmSpec, 'Vdc' | 'deadTime_s' | 'deviceDrop_V' | 'zeroCurrent_A' | 'fsw_Hz' | 'compensation'>, private readonly exact: ExactSegment | null = null) {
    this.rk4 = inner instanceof Rk4Stepper;
    this.Th = 0.5 / spec.fsw_Hz;
    this.Vdc = spec.Vdc;
    this.td = spec.deadTime_s;
    this.drop = spec.deviceDrop_V;
    this.i0 = spec.zeroCurrent_A > 0 ? spec.zeroCurrent_A : 1e-12;
    this.yc = new Float64Array(8);
    this.compBand = spec.compensation ? Math.max(spec.compensation.band_A, this.i0) : 0;
    switchingStateTable(this.Vdc, this.drop, this.svt);
  }

  resetProbe(): void {
    this.probing = true;
    this.nb = 0;
    const l = this.legVs, c = this.cmdVs;
    l[0] = 0; l[1] = 0; l[2] = 0;
    c[0] = 0; c[1] = 0; c[2] = 0;
    this.idcInt = 0;
    this.idcSqInt = 0;
    this.span = 0;
  }

  /**
   * Integrate y in place over one half carrier period [t0, t1] with the legs' duties d[0..2]:
   * `rising` the valley-to-peak half (turn-on edges), else the peak-to-valley half (turn-off edges).
   * With `close` false the last segment is left open (y stays at the half's last switching instant)
   * and the next call, which must be the following half on the same y, continues it: the zero state
   * around the carrier's peak is then one segment, not two.
   */
  half(y: Float64Array, t0: number, t1: number, d: Float64Array, rising: boolean, close = true): void {
    // the times cross the (not inlined) call below through a typed array: no boxed arguments
    const hs = this.hs;
    hs[0] = t0;
    hs[1] = t1;
    this.halfAt(y, d, rising, close);
  }

  /** `half` over [hs[0], hs[1]]. */
  private halfAt(y: Float64Array, d: Float64Array, rising: boolean, close: boolean): void {
    const t0 = this.hs[0]!, t1 = this.hs[1]!;
    const Th = t1 - t0;
    const plant = this.plant;
    if (Number.isNaN(this.tOpen)) {
      // y is at t0: the rotation's origin near its angle (the simulator sets it at each period's start)
      const dth = y[3]! - plant.th0;
      if (!(dth > -0.25 && dth < 0.25)) plant.setAngleOrigin(y[3]!);
      this.tOpen = t0;
      this.currents(y);
      this.tv[0] = t0;
      if (this.nb === 0 && this.probing) this.sample();
      this.slewBound(y);
      const b = this.compBand, iph = this.iph; // the compensation's current signs, linear across its band
      if (b > 0) for (let x = 0; x < 3; x++) this.compSign[x] = iph[x]! > b ? 1 : iph[x]! < -b ? -1 : iph[x]! / b;
    }
    const edgeT = this.edgeT, pendT = this.pendT;
    const comp = this.compBand > 0;
    for (let x = 0; x < 3; x++) {
      // the probe's command is the modulator's duty; the compensation is the bridge's own
      const dx = comp ? compensatedDuty(d[x]!, this.compSign[x]!, rising, this.td / Th, this.drop / this.Vdc) : d[x]!;
      if (this.probing) this.cmdVs[x] += d[x]! * this.Vdc * Th;
      // the comparator at the half's start: at the valley on only for d = 1, at the peak on for any d > 0
      const start = rising ? dx >= 1 : dx > 0;
      if ((start ? 1 : 0) !== this.cmd[x]) { this.tv[0] = t0; this.command(y, x, start ? 1 : 0); }
      edgeT[x] = dx > 0 && dx < 1 ? (rising ? t0 + (1 - dx) * Th : t0 + dx * Th) : Infinity;
    }
    const s = rising ? 1 : 0;
    for (let guard = 0; guard < 12; guard++) {
      // the next instant: the earliest commanded or delayed edge (each read once; an edge taken at
      // tn changes only its own leg's entries)
      const e0 = edgeT[0]!, e1 = edgeT[1]!, e2 = edgeT[2]!, p0 = pendT[0]!, p1 = pendT[1]!, p2 = pendT[2]!;
      let tn = e0 < e1 ? e0 : e1;
      if (e2 < tn) tn = e2;
      if (p0 < tn) tn = p0;
      if (p1 < tn) tn = p1;
      if (p2 < tn) tn = p2;
      if (!(tn < t1)) break;
      this.tv[0] = tn;
      if (p0 <= tn) this.delayed(y, 0);
      if (p1 <= tn) this.delayed(y, 1);
      if (p2 <= tn) this.delayed(y, 2);
      if (e0 <= tn) { this.command(y, 0, s); edgeT[0] = Infinity; }
      if (e1 <= tn) { this.command(y, 1, s); edgeT[1] = Infinity; }
      if (e2 <= tn) { this.command(y, 2, s); edgeT[2] = Infinity; }
    }
    if (close) {
      this.tv[0] = t1;
      this.advance(y);
      this.tOpen = NaN;
    }
  }

  /**
   * The comparator commands leg x to state s at time t. The sign of the leg's current at t decides
   * the dead time's diode: known without integrating to t when the current at the open segment's
   * start is farther from zero than it can move by t (see `slewBound`), else from the state
   * integrated to t.
   */
  private command(y: Float64Array, x: number, s: number): void {
    const t = this.tv[0]!;
    this.cmd[x] = s;
    const pendT = this.pendT;
    if (pendT[x]! !== Infinity) {
      if (this.pendS[x] === s) return; // already on its way there
      pendT[x] = Infinity; // an edge still waiting out the dead time is undone: the leg stays where it is
    }
    if (this.on[x] === s) return;
    if (this.td <= 0) { this.advance(y); this.on[x] = s; return; }
    const i0 = this.iph[x]!;
    if (!(Math.abs(i0) > this.i0 + this.slew * (t - this.tOpen))) this.advance(y);
    const i = this.iph[x]!;
    const now = s === 1 ? i < -this.i0 : i > this.i0;
    if (now) { this.advance(y); this.on[x] = s; }
    else { pendT[x] = t + this.td; this.pendS[x] = s; }
  }

  /** Leg x's delayed edge, due at tv[0]: the open segment integrated to it, the leg set. */
  private delayed(y: Float64Array, x: number): void {
    this.advance(y);
    this.on[x] = this.pendS[x]!;
    this.pendT[x] = Infinity;
  }

  /** Integrate the open segment up to t (the legs unchanged since its start). */
  private advance(y: Float64Array): void {
    const t = this.tv[0]!;
    if (t > this.tOpen) {
      this.segment(y);
      this.tOpen = t;
    }
  }

  /**
   * A bound on |di_x/dt| of any phase over the next half period, A/s, for a constant-parameter
   * machine: |di_dq/dt| <= (|v| + Rs I + w (Lmax I + psiM)) / Lmin plus the frame's w I, with |v|
   * at most 2(Vdc + 2 drop)/3 and I twice the present |i| plus Vdc Th/Lmin; twice that for margin.
   * Infinity for any other machine (the sign is then always taken from the integrated state).
   * Into `slew` (no double returned).
   */
  private slewBound(y: Float64Array): void {
    const m = this.plant.model.linear;
    if (m === null) { this.slew = Infinity; return; }
    const iph = this.iph;
    const I = Math.sqrt((2 / 3) * (iph[0]! * iph[0]! + iph[1]! * iph[1]! + iph[2]! * iph[2]!));
    const Lmin = m.Ld < m.Lq ? m.Ld : m.Lq, Lmax = m.Ld > m.Lq ? m.Ld : m.Lq;
    const w = Math.abs(this.plant.model.polePairs * y[2]!);
    const V = (2 / 3) * (this.Vdc + 2 * this.drop);
    const Ib = 2 * I + (this.Vdc * this.Th) / Lmin;
    this.slew = 2 * ((V + this.plant.model.Rs * Ib + w * (Lmax * Ib + m.psiM)) / Lmin + w * Ib);
  }

  /** Integrate [ta, tb] with the present leg states; accumulate the probe. */
  private segment(y: Float64Array): void {
    const ta = this.tOpen, tb = this.tv[0]!;
    const iph = this.iph;
    const on = this.on;
    const Vdc = this.Vdc, drop = this.drop;
    const s0 = on[0]!, s1 = on[1]!, s2 = on[2]!;
    const input = this.plant.input;
    const i0 = this.i0, ia = iph[0]!, ib = iph[1]!, ic = iph[2]!;
    let ua: number, ub: number, uc: number;
    if (drop === 0 || (Math.abs(ia) > i0 && Math.abs(ib) > i0 && Math.abs(ic) > i0)) {
      // the state's voltages for the currents' signs, done once per run (`svt`: the arithmetic below)
      const tab = this.svt, k = 5 * (s0 + 2 * s1 + 4 * s2 + (ia > 0 ? 8 : 0) + (ib > 0 ? 16 : 0) + (ic > 0 ? 32 : 0));
      input[0] = tab[k]!; input[1] = tab[k + 1]!;
      ua = tab[k + 2]!; ub = tab[k + 3]!; uc = tab[k + 4]!;
    } else {
      // the device drop against the current's sign, linear across |i| <= i0 (written out: no call)
      ua = s0 * Vdc - drop * (ia > i0 ? 1 : ia < -i0 ? -1 : ia / i0);
      ub = s1 * Vdc - drop * (ib > i0 ? 1 : ib < -i0 ? -1 : ib / i0);
      uc = s2 * Vdc - drop * (ic > i0 ? 1 : ic < -i0 ? -1 : ic / i0);
      // the phase voltages in alpha-beta (legsToAlphaBeta, written out)
      input[0] = (2 * ua - ub - uc) / 3;
      input[1] = (ub - uc) * INV_SQRT3;
    }
    const probing = this.probing;
    const dc0 = probing ? s0 * iph[0]! + s1 * iph[1]! + s2 * iph[2]! : 0; // the DC-link current, for the probe only
    if (this.rk4) this.rk4Segment(y);
    else this.inner.period(y, ta, tb);
    this.segments++;
    this.currents(y);
    if (probing) {
      const dc1 = s0 * iph[0]! + s1 * iph[1]! + s2 * iph[2]!;
      const h = tb - ta;
      const lv = this.legVs;
      lv[0] += ua * h; lv[1] += ub * h; lv[2] += uc * h;
      this.idcInt += 0.5 * (dc0 + dc1) * h;
      this.idcSqInt += ((dc0 * dc0 + dc0 * dc1 + dc1 * dc1) * h) / 3;
      this.span += h;
      this.sample();
    }
    const win = this.window;
    if (win !== null && tb >= win.from && tb <= win.to) {
      const j = win.slot();
      if (j >= 0) {
        win.t[j] = tb; win.ia[j] = iph[0]!; win.ib[j] = iph[1]!; win.ic[j] = iph[2]!; win.va[j] = input[0]!;
        win.idc[j] = s0 * iph[0]! + s1 * iph[1]! + s2 * iph[2]!;
      }
    }
  }

  /**
   * The segment [tOpen, tv[0]] piece by piece between load breakpoints (the plant's load set once
   * per piece, as Stepper.period does): each piece by the exact segment (switching-segment.ts) when
   * one is given and it applies, else by one classical RK4 step (common practice, no source); the
   * time goes to the plant through its typed array (no boxed argument).
   */
  private rk4Segment(y: Float64Array): void {
    const tb = this.tv[0]!;
    const ex = this.exact;
    const a0 = this.tOpen;
    const nb = this.nextBreak;
    if (a0 < nb && tb <= nb && nb === this.loadKey) {
      // the common case, one piece with the plant's load already set (what the loop below does then)
      if (tb - a0 > 0) this.piece(y, ex, a0, tb);
      return;
    }
    const plant = this.plant;
    const load = plant.params.load;
    let a = a0;
    for (let piece = 0; piece < 8; piece++) {
      if (a >= this.nextBreak) this.nextBreak = nextLoadBreak(load, a);
      const b = this.nextBreak < tb ? this.nextBreak : tb;
      if (this.nextBreak !== this.loadKey) { plant.setLoadSegment(a, b); this.loadKey = this.nextBreak; }
      if (b - a > 0) this.piece(y, ex, a, b);
      if (b >= tb) break;
      a = b;
    }
  }

  /** One piece [a, b]: the exact segment, else one RK4 step. */
  private piece(y: Float64Array, ex: ExactSegment | null, a: number, b: number): void {
    if (ex !== null) {
      ex.span[0] = a;
      ex.span[1] = b;
      if (ex.step(y)) return;
    }
    (this.inner as Rk4Stepper).single(y, a, b); // rare: the closed form declined
  }

  private sample(): void {
    const t = this.tv[0]!;
    const n = this.nb;
    if (n >= PROBE_CAPACITY) return;
    this.tb[n] = t;
    this.ib[3 * n] = this.iph[0]!;
    this.ib[3 * n + 1] = this.iph[1]!;
    this.ib[3 * n + 2] = this.iph[2]!;
    this.nb = n + 1;
  }

  /** The phase currents of the state y into `iph` (the rotation from the plant's angle origin). */
  currents(y: Float64Array): void {
    const plant = this.plant;
    let id: number, iq: number;
    if (plant.fluxStates) {
      plant.currentState(y, this.yc);
      id = this.yc[0]!;
      iq = this.yc[1]!;
    } else {
      id = y[0]!;
      iq = y[1]!;
    }
    const dth = y[3]! - plant.th0;
    let c: number, s: number;
    if (dth === 0) {
      // at the origin itself the series give exactly its cos and sin
      c = plant.c0;
      s = plant.s0;
    } else if (dth > -0.5 && dth < 0.5) {
      const sd = sinSmall(dth), cd = cosSmall(dth);
      c = plant.c0 * cd - plant.s0 * sd;
      s = plant.s0 * cd + plant.c0 * sd;
    } else {
      c = Math.cos(y[3]!);
      s = Math.sin(y[3]!);
    }
    // the rotation handed to the exact segment that starts here (it needs the same cos and sin)
    const ex = this.exact;
    if (ex !== null) { const r = ex.rot; r[0] = y[3]!; r[1] = c; r[2] = s; }
    const ial = id * c - iq * s;
    const ibe = id * s + iq * c;
    const iph = this.iph;
    iph[0] = ial;
    iph[1] = -0.5 * ial + SQRT3_2 * ibe;
    iph[2] = -0.5 * ial - SQRT3_2 * ibe;
  }
}

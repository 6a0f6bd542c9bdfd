/**
 * The trace recorder of a run: one sample of every channel of TRACE_NAMES at every period start
 * (and at the end), fed at once to a streaming min/max decimator sized from the number of periods
 * and `maxPoints`, and to the streaming trackers of the speed metrics that need full-rate samples
 * (step response, load steps, steady-state error), so the memory of a run does not grow with its
 * length. The row layout follows TRACE_NAMES (channel c at row index c - 1; t_s is the time axis);
 * with an angle source (angle-sensing.ts) the row goes on with ANGLE_TRACE_NAMES, its last sample's
 * angle error and speed estimate: one decimator for every channel.
 */
import { I_D, I_Q, OMEGA, THETA } from './plant';
import type { Plant } from './plant';
import type { CascadeController } from '../control/controller';
import { hexagonFraction, inscribedRadius } from '../drive/inverter';
import type { MachineModel } from '../machine/machine-model';
import { cosSmall, sinSmall } from '../mathematics/rotation';
import { inverseClarkeAmplitudeInvariantInto } from '../mathematics/transforms';
import { StreamingMinMax } from './decimate';
import { StepResponseTracker, LoadStepTracker, SteadyStateTracker, finiteOrNull } from './metrics';
import { RAD_S_TO_RPM } from '../base/units';
import type { AnySetup } from './simulation-setup';
import { ANGLE_TRACE_NAMES, type AngleSensing } from './angle-sensing';
import { TRACE_NAMES, type LoadStepResult, type TraceName, type Traces } from './simulation-result';

/** A load step is read only from a settled speed: within SETTLED_FRACTION of the reference, and at least this, rpm. */
const SETTLED_FLOOR_RPM = 1;
// module-local constants and references (a CommonJS build turns an imported binding into a getter)
const W_TO_RPM: number = RAD_S_TO_RPM;
const sinSmallL = sinSmall;
const cosSmallL = cosSmall;
const clarkeInvL = inverseClarkeAmplitudeInvariantInto;

/** Row index of a channel (the time axis is kept apart). */
export const channel = (name: Exclude<TraceName, 't_s'>): number => TRACE_NAMES.indexOf(name) - 1;
const SPEED_REF = channel('speedRef_rpm');
const SPEED = channel('speed_rpm');
const TORQUE = channel('torque_Nm');
const LOAD = channel('loadTorque_Nm');
const ID_REF = channel('idRef_A');
const IQ_REF = channel('iqRef_A');
const ID = channel('id_A');
const IQ = channel('iq_A');
const VD = channel('vd_V');
const VQ = channel('vq_V');
const VNORM = channel('vNorm');
const IA = channel('ia_A'); // ib_A and ic_A follow
const PDC = channel('pDc_W');
const hexagonFractionL = hexagonFraction;
// the trackers read a row's speed reference and speed side by side (metrics.ts takeRows)
if (SPEED !== SPEED_REF + 1) throw new Error('speed_rpm must follow speedRef_rpm in TRACE_NAMES');
/** the angle source's channels follow TRACE_NAMES' */
const ANGLE_ERROR = TRACE_NAMES.length - 1;
const SPEED_ESTIMATE = ANGLE_ERROR + 1;

export function scheduleBefore(steps: ReadonlyArray<{ t: number; v: number }>, t: number, initial: number): number {
  let v = initial;
  for (const s of steps) if (s.t < t) v = s.v;
  return v;
}

/** The speed metrics of a run's recorded samples. */
export interface SpeedMetrics {
  rise: number | null;
  over: number | null;
  settle: number | null;
  dip: number | null;
  recov: number | null;
  sse: number | null;
}

export class TraceRecorder {
  /** the last recorded sample [t, speed rpm, id, iq] */
  readonly last = new Float64Array(4);
  /** samples recorded */
  count = 0;
  /** the largest number of samples: periods + 1 */
  readonly cap: number;
  private readonly dec: StreamingMinMax;
  /** the decimator's row buffer: each sample's channels are written into it directly */
  private readonly buf: Float64Array;
  private readonly msmp = new Float64Array(3);
  /** channels per row */
  private readonly nch: number;
  /** samples the trackers have taken (they take a bucket's at once, before it is reduced; the rest at the end) */
  private fed = 0;
  private readonly stepTrk: StepResponseTracker | null;
  /** one tracker per load event; their windows [t, next event) do not overlap, so only the current one is fed */
  private readonly loadTrks: LoadStepTracker[];
  private loadAt = 0;
  /** the load schedule's breakpoints and the segment of the last sample (samples come in time order) */
  private readonly loadT: Float64Array;
  private readonly loadV: Float64Array;
  private readonly loadK: number;
  private loadSeg = 0;
  private readonly sseTrk: SteadyStateTracker | null;
  private readonly Ts: number;
  private readonly p: number;
  private readonly psiM: number;
  private readonly dLdq: number;
  private readonly linear: boolean;
  private readonly locked: boolean;
  /** the modulation limit is a circle of radius vRadius (else the bridge's hexagon for the bus Vdc) */
  private readonly circle: boolean;
  private readonly vRadius: number;
  /** the hexagon's inscribed radius Vdc/√3 */
  private readonly hexInscribed: number;

  /** angle: the run's angle source (null: the true angle, no angle channels) */
  constructor(private readonly setup: AnySetup, private readonly model: MachineModel, private readonly plant: Plant, private readonly ctrl: CascadeController, periods: number, maxPoints: number, private readonly angle: AngleSensing | null = null) {
    this.cap = periods + 1;
    this.Ts = setup.controller.Ts;
    const nch = TRACE_NAMES.length - 1 + (angle !== null ? ANGLE_TRACE_NAMES.length : 0);
    this.nch = nch;
    this.dec = new StreamingMinMax(nch, this.cap, maxPoints);
    this.buf = this.dec.buf;
    const vspec = setup.controller.voltage;
    this.circle = vspec.shape === 'circle';
    this.vRadius = vspec.radius;
    this.hexInscribed = inscribedRadius(vspec.Vdc);
    const marks = setup.marks;
    const allEvents = [...marks.speedSteps.map((s) => s.t), ...marks.loadEvents].sort((a, b) => a - b);
    const nextAfter = (t: number): number => {
      for (const x of allEvents) if (x > t + 1e-12) return x;
      return Infinity;
    };
    const speedMode = setup.controller.mode === 'speed';
    const s0 = marks.speedSteps[0];
    this.stepTrk = speedMode && s0
      ? new StepResponseTracker(s0.t, nextAfter(s0.t), scheduleBefore(marks.speedSteps, s0.t, setup.initialSpeed_rad_s) * RAD_S_TO_RPM, s0.v * RAD_S_TO_RPM)
      : null;
    this.loadTrks = speedMode ? marks.loadEvents.map((t) => new LoadStepTracker(t, nextAfter(t), undefined, 64, SETTLED_FLOOR_RPM)) : [];
    // the steady-state window is 5 % of the run (or 2 periods): the ring holds a little more
    this.sseTrk = speedMode ? new SteadyStateTracker(Math.ceil(0.05 * this.cap) + 8) : null;
    this.p = model.polePairs;
    const lin = model.linear;
    this.linear = lin !== null;
    this.psiM = lin ? lin.psiM : 0;
    this.dLdq = lin ? lin.Ld - lin.Lq : 0;
    this.locked = setup.plant.mechanics !== 'free';
    this.loadT = setup.plant.load.times;
    this.loadV = setup.plant.load.levels;
    this.loadK = setup.plant.load.quadraticK;
  }

  /**
   * Record the sample of period `idx` (the samples come in order: idx = count) from the state y. The plant's angle origin must be the
   * state's angle (plant.setAngleOrigin): its cos and sin serve the phase currents and the voltage.
   */
  record(idx: number, y: Float64Array): void {
    if (idx !== this.count) throw new Error(`the recorder takes the samples in order: sample ${this.count} expected, ${idx} given`);
    const t = idx * this.Ts;
    const plant = this.plant;
    const ctrl = this.ctrl;
    const p = this.p;
    const id = y[I_D]!, iq = y[I_Q]!, w = y[OMEGA]!, th = y[THETA]!;
    const wr = ctrl.speedRefOut * W_TO_RPM;
    const wRpm = w * W_TO_RPM;
    const last = this.last;
    last[0] = t; last[1] = wRpm; last[2] = id; last[3] = iq;
    this.count++;
    const dec = this.dec;
    dec.time[0] = t;
    const o = dec.slotAt();
    if (o < 0) {
      // beyond the samples the decimator holds: the trackers take this one at once
      const m = this.msmp;
      m[0] = t; m[1] = wr; m[2] = wRpm;
      this.takeUnheld();
      return;
    }
    const c = plant.c0, s = plant.s0;
    const ia = id * c - iq * s;
    const ib = id * s + iq * c;
    const vab = plant.input;
    const va = vab[0]!, vb = vab[1]!;
    const row = this.buf;
    row[o + SPEED_REF] = wr;
    row[o + SPEED] = wRpm;
    row[o + TORQUE] = this.linear ? 1.5 * p * (this.psiM * iq + this.dLdq * id * iq) : this.model.torque(id, iq);
    row[o + LOAD] = this.locked ? 0 : this.loadTorque(t, w);
    row[o + ID_REF] = ctrl.idRef;
    row[o + IQ_REF] = ctrl.iqRef;
    row[o + ID] = id;
    row[o + IQ] = iq;
    row[o + VNORM] = this.circle ? Math.sqrt(va * va + vb * vb) / this.vRadius : hexagonFractionL(va, vb, this.hexInscribed);
    clarkeInvL(ia, ib, 0, row, o + IA);
    row[o + PDC] = 1.5 * (va * ia + vb * ib);
    // applied voltage in dq at the mid-period angle: cosSinNear(c, s, dm, th + dm) written out
    const dm = 0.5 * p * w * this.Ts;
    let cm: number, sm: number;
    if (dm > -0.5 && dm < 0.5) {
      const sd = sinSmallL(dm), cd = cosSmallL(dm);
      cm = c * cd - s * sd;
      sm = s * cd + c * sd;
    } else {
      cm = Math.cos(th + dm);
      sm = Math.sin(th + dm);
    }
    row[o + VD] = va * cm + vb * sm;
    row[o + VQ] = -va * sm + vb * cm;
    const a = this.angle;
    if (a !== null) {
      row[o + ANGLE_ERROR] = a.error;
      row[o + SPEED_ESTIMATE] = a.speedEstimate_rpm;
    }
    // the trackers take the bucket's samples (speed reference and speed) before its rows go
    if (dec.ending) this.feed(dec.count + 1);
    dec.commit();
  }

  /**
   * The speed trackers take the samples fed..end-1 from the rows the decimator holds (sample k at
   * time k·Ts, its speed reference and speed side by side in the row); each load tracker the
   * samples before its window's end, from the first window not yet ended on, as one by one.
   */
  private feed(end: number): void {
    const k0 = this.fed;
    if (end <= k0) return;
    const first = this.dec.first;
    const rows = this.buf;
    const nc = this.nch;
    const Ts = this.Ts;
    const i1 = end - first;
    if (this.stepTrk) this.stepTrk.takeRows(rows, nc, SPEED_REF, k0 - first, i1, first, Ts);
    const lt = this.loadTrks;
    let i = k0 - first;
    while (i < i1 && this.loadAt < lt.length) {
      const tr = lt[this.loadAt]!;
      const tEnd = tr.tEnd;
      if (!((first + i) * Ts < tEnd)) { this.loadAt++; continue; }
      let j = i + 1;
      while (j < i1 && (first + j) * Ts < tEnd) j++;
      tr.takeRows(rows, nc, SPEED_REF, i, j, first, Ts);
      i = j;
    }
    if (this.sseTrk) this.sseTrk.takeRows(rows, nc, SPEED_REF, k0 - first, i1, first, Ts);
    this.fed = end;
  }

  /** The sample in msmp [t, speed reference, speed], after the held ones, to the trackers at once. */
  private takeUnheld(): void {
    this.feed(this.dec.count);
    const m = this.msmp;
    const t = m[0]!;
    if (this.stepTrk) this.stepTrk.take(m);
    const lt = this.loadTrks;
    while (this.loadAt < lt.length && !(t < lt[this.loadAt]!.tEnd)) this.loadAt++;
    if (this.loadAt < lt.length) lt[this.loadAt]!.take(m);
    if (this.sseTrk) this.sseTrk.take(m);
    this.fed = this.count;
  }


  /**
   * The plant's load torque at (t, w) (plant.loadTorque, the same arithmetic as loadLevel), its
   * segment found by walking on from the last sample's instead of a search.
   */
  private loadTorque(t: number, w: number): number {
    const T = this.loadT;
    const V = this.loadV;
    const n = T.length;
    let level: number;
    if (n === 1 || t >= T[n - 1]!) level = V[n - 1]!;
    else {
      // lo: the last breakpoint at or before t (0 before the first), below n - 1, as the bisection finds it
      let lo = this.loadSeg;
      if (!(T[lo]! <= t)) lo = 0;
      while (lo + 1 < n - 1 && T[lo + 1]! <= t) lo++;
      this.loadSeg = lo;
      const t0 = T[lo]!;
      const t1 = T[lo + 1]!;
      level = t1 <= t0 ? V[lo + 1]! : V[lo]! + ((t - t0) / (t1 - t0)) * (V[lo + 1]! - V[lo]!);
    }
    return level + this.loadK * w * Math.abs(w);
  }

  /** The speed metrics (speed mode, more than two samples; else all null) at the last sample time tLast. */
  speedMetrics(tLast: number): SpeedMetrics {
    const out: SpeedMetrics = { rise: null, over: null, settle: null, dip: null, recov: null, sse: null };
    if (this.setup.controller.mode !== 'speed' || this.count <= 2) return out;
    this.feed(this.dec.count);
    if (this.stepTrk) {
      const r = this.stepTrk.result();
      out.rise = r.riseTime_s; out.over = r.overshoot_pct; out.settle = r.settlingTime_s;
    }
    const r0 = this.loadTrks[0]?.result();
    if (r0) { out.dip = r0.dip; out.recov = r0.recovery_s; }
    out.sse = this.sseTrk!.result(Math.max(0.05 * tLast, 2 * this.Ts));
    return out;
  }

  /** Every load event's response, in time order. */
  loadSteps(): LoadStepResult[] {
    this.feed(this.dec.count);
    return this.loadTrks.map((tr) => {
      const r = tr.result();
      return { t_s: tr.tStep, dip_rpm: finiteOrNull(r.dip), recovery_s: finiteOrNull(r.recovery_s), errorAtStep_rpm: finiteOrNull(r.errorAtStep), settled: r.settled };
    });
  }

  /** The decimated traces (the angle source's after TRACE_NAMES'); non-finite samples (a divergence) become 0 so no NaN escapes. */
  traces(): Traces {
    this.feed(this.dec.count);
    const decd = this.dec.finish();
    const scan = !this.dec.allFinite;
    const traces = { t_s: decd.t } as Traces;
    const names = this.angle !== null ? [...TRACE_NAMES.slice(1), ...ANGLE_TRACE_NAMES] : TRACE_NAMES.slice(1);
    for (let c = 0; c < names.length; c++) {
      const a = decd.channels[c]!;
      // x - x is 0 for a finite x, NaN for an infinite or NaN one
      if (scan) for (let j = 0, n = a.length; j < n; j++) { const x = a[j]!; if (x - x !== 0) a[j] = 0; }
      traces[names[c]!] = a;
    }
    return traces;
  }
}

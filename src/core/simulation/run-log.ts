/**
 * The event log of a run, fed once per control period: intervals with the current reference at the
 * drive limit and with the voltage at the modulation limit (closed after `gap` periods without, at
 * most MAX_INTERVALS listed per kind), overspeed intervals, the rms and the peak current (when it
 * came, the reference then, and how long after the voltage limit let go).
 */
import { RAD_S_TO_RPM } from '../base/units';
import type { EventKind, SimulationEvent } from './simulation-setup';
import type { PeakCurrentDetail } from './simulation-result';
import { S_T, S_ID, S_IQ, S_W, S_ID_REF, S_IQ_REF } from './period-sample';

export const MAX_INTERVALS = 200;

export class RunLog {
  readonly events: SimulationEvent[] = [];
  peakI2 = 0;
  peakT = 0;
  peakRef2 = 0;
  peakSinceSat = Infinity;
  lastSatT = -Infinity;
  sumI2 = 0;
  satPeriods = 0;
  private curStart = -1;
  private curOff = 0;
  private satStart = -1;
  private satOff = 0;
  private overStart = -1;
  private curCount = 0;
  private satCount = 0;

  constructor(private readonly Ts: number, private readonly gap: number, private readonly wOver: number) {}

  private closeInterval(kind: EventKind, t0: number, t1: number, count: number): void {
    if (count < MAX_INTERVALS) {
      this.events.push({
        kind, t_s: t0, tEnd_s: t1,
        message: kind === 'current-limit'
          ? 'current reference at the drive limit (Imax, or the torque the voltage allows at this speed)'
          : 'voltage vector at the modulation limit (the current loop has lost authority)',
      });
    } else if (count === MAX_INTERVALS) {
      this.events.push({ kind, t_s: t0, message: `more than ${MAX_INTERVALS} intervals; the rest are not listed` });
    }
  }

  private overspeedEvent(t0: number, t1: number): void {
    this.events.push({ kind: 'overspeed', t_s: t0, tEnd_s: t1, message: `speed above ${(this.wOver * RAD_S_TO_RPM).toPrecision(4)} rpm` });
  }

  /** The period's sample (see period-sample.ts) and the controller's flags. */
  observe(x: Float64Array, currentLimited: boolean, voltageSaturated: boolean): void {
    const id = x[S_ID]!, iq = x[S_IQ]!, w = x[S_W]!;
    const i2 = id * id + iq * iq;
    this.sumI2 += i2;
    // most periods: no limit met, no interval open, no new peak, no overspeed: nothing else to note
    if (!currentLimited && !voltageSaturated && this.curStart < 0 && this.satStart < 0 && this.overStart < 0 && !(i2 > this.peakI2) && !(Math.abs(w) > this.wOver)) return;
    const t0 = x[S_T]!;
    const { gap, Ts } = this;
    if (currentLimited) { if (this.curStart < 0) this.curStart = t0; this.curOff = 0; }
    else if (this.curStart >= 0 && ++this.curOff >= gap) { this.closeInterval('current-limit', this.curStart, t0 - (gap - 1) * Ts, this.curCount++); this.curStart = -1; }
    if (voltageSaturated) { this.satPeriods++; this.lastSatT = t0; if (this.satStart < 0) this.satStart = t0; this.satOff = 0; }
    else if (this.satStart >= 0 && ++this.satOff >= gap) { this.closeInterval('voltage-saturation', this.satStart, t0 - (gap - 1) * Ts, this.satCount++); this.satStart = -1; }
    if (i2 > this.peakI2) this.peak(i2, t0, x[S_ID_REF]! * x[S_ID_REF]! + x[S_IQ_REF]! * x[S_IQ_REF]!);
    if (Math.abs(w) > this.wOver) { if (this.overStart < 0) this.overStart = t0; }
    else if (this.overStart >= 0) { this.overspeedEvent(this.overStart, t0); this.overStart = -1; }
  }

  /** A candidate for the peak current |i|² at time t with the reference |i_ref|² then. */
  peak(i2: number, t: number, ref2: number): void {
    if (i2 > this.peakI2) {
      this.peakI2 = i2;
      this.peakT = t;
      this.peakRef2 = ref2;
      this.peakSinceSat = t - this.lastSatT;
    }
  }

  /** Close the intervals still open at the last sample time and sort the events by time. */
  finish(tLast: number): SimulationEvent[] {
    if (this.curStart >= 0) this.closeInterval('current-limit', this.curStart, tLast, this.curCount++);
    if (this.satStart >= 0) this.closeInterval('voltage-saturation', this.satStart, tLast, this.satCount++);
    if (this.overStart >= 0) this.overspeedEvent(this.overStart, tLast);
    this.events.sort((a, b) => a.t_s - b.t_s);
    return this.events;
  }

  /** The sample of the largest current, or undefined when none was recorded. */
  peakDetail(): PeakCurrentDetail | undefined {
    return this.peakI2 > 0 && Number.isFinite(this.peakI2)
      ? { t_s: this.peakT, reference_A: Math.sqrt(this.peakRef2), sinceVoltageLimit_s: this.peakSinceSat }
      : undefined;
  }
}

/**
 * The switching model as the simulator's stepper: each control period the controller's voltage
 * command (the plant's input, alpha-beta) is turned into the legs' duties by the modulator
 * (../drive/pwm-modulator.ts) and the period integrated through the bridge's switching states
 * (switching-period.ts). With one control update per carrier period a control period is a whole
 * carrier period (its rising then its falling half, the same duties); with two it is one half,
 * rising for the even periods and falling for the odd ones (the carrier's valley at t = 0).
 * The command is put back into the plant's input after the period. After each carrier period the
 * bridge's probe goes into the run's capture (switching-capture.ts) and is reset; `result` gives
 * the run's SwitchingResult (switching-summary.ts). Allocation-free during the run.
 */
import type { PwmSpec } from '../drive/pwm-spec';
import { legDutiesOf } from '../drive/pwm-modulator';
import type { Plant } from './plant';
import { Rk4Stepper, Stepper, makeStepper } from './stepper';
import { SwitchingPeriod } from './switching-period';
import { ExactSegment } from './switching-segment';
import { SwitchingCapture } from './switching-capture';
import { periodRipple } from './current-ripple';
import { switchingSummary } from './switching-summary';
import type { SwitchingResult } from './switching-result';
import type { AnySetup } from './simulation-setup';

export class SwitchingStepper extends Stepper {
  readonly bridge: SwitchingPeriod;
  /** the duties of the last period */
  readonly duty = new Float64Array(3);
  /** what the run keeps for its result (null: nothing kept) */
  readonly capture: SwitchingCapture | null;
  /** the angle at the start of the carrier period in progress (unwrapped) */
  private thStart = NaN;
  /** the carrier period in progress is being recorded */
  private open = false;
  constructor(plant: Plant, Ts: number, inner: Stepper, private readonly spec: PwmSpec, exact: ExactSegment | null = null, capture: SwitchingCapture | null = null) {
    super(plant, Ts);
    this.bridge = new SwitchingPeriod(plant, inner, spec, exact);
    this.capture = capture;
    if (capture !== null) this.bridge.window = capture.window;
  }

  protected override integrate(y: Float64Array): void {
    const t0 = this.span[0]!, t1 = this.span[1]!;
    const u = this.plant.input;
    const va = u[0]!, vb = u[1]!;
    const d = this.duty;
    const cap = this.capture;
    const th0 = y[3]!;
    legDutiesOf(u, this.spec.Vdc, this.spec.modulation, d);
    let whole = true; // a carrier period ends with this control period
    if (this.spec.updatesPerPeriod === 1) {
      const tm = 0.5 * (t0 + t1);
      if (cap !== null) this.startPeriod(cap, th0, t0);
      this.bridge.half(y, t0, tm, d, true, false); // the zero state about the peak stays one segment
      this.bridge.half(y, tm, t1, d, false);
    } else {
      const rising = (Math.round(t0 / this.Ts) & 1) === 0;
      if (cap !== null && rising) this.startPeriod(cap, th0, t0);
      this.bridge.half(y, t0, t1, d, rising);
      whole = !rising;
    }
    if (cap !== null) {
      cap.thetaRun += y[3]! - th0;
      if (whole && this.open) this.endPeriod(cap, t1);
    }
    u[0] = va;
    u[1] = vb;
  }

  private startPeriod(cap: SwitchingCapture, th0: number, t0: number): void {
    if (Number.isNaN(cap.thetaRun)) cap.thetaRun = th0;
    this.open = t0 >= cap.recordFrom;
    // a period before the ring's span is never read: its probe is skipped
    if (!this.open) { this.bridge.probing = false; return; }
    this.thStart = cap.thetaRun;
    this.bridge.resetProbe();
  }

  /** The carrier period's record from the bridge's probe. */
  private endPeriod(cap: SwitchingCapture, t1: number): void {
    const b = this.bridge;
    const span = b.span;
    if (!(span > 0) || b.nb < 2) return;
    const j = cap.slot();
    cap.t[j] = b.tb[0]!;
    cap.theta[j] = this.thStart;
    cap.ia[j] = b.ib[0]!;
    cap.p2p[j] = periodRipple(b.tb, b.ib, b.nb, 3, 0);
    const inv = 1 / span;
    cap.ea[j] = (b.legVs[0]! - b.cmdVs[0]!) * inv;
    cap.eb[j] = (b.legVs[1]! - b.cmdVs[1]!) * inv;
    cap.ec[j] = (b.legVs[2]! - b.cmdVs[2]!) * inv;
    cap.idc[j] = b.idcInt;
    cap.idc2[j] = b.idcSqInt;
    cap.span[j] = span;
    cap.tEnd = t1;
    cap.thetaEnd = cap.thetaRun;
    cap.iaEnd = b.iph[0]!;
  }

  /** The run's switching result from what was captured (null when nothing was). */
  result(): SwitchingResult | null {
    return this.capture === null ? null : switchingSummary(this.capture, this.spec);
  }

  protected piece(): void {
    throw new Error('SwitchingStepper integrates by period only');
  }
}

/**
 * The stepper of a setup: the switching model when `pwm.model` is 'switching', else null (the
 * averaged model). The segments of a constant-parameter machine (current states, the voltage held
 * in the stationary frame) go to the exact propagator (switching-segment.ts; one classical RK4 step
 * where it declines, and for every segment with `solver.switchingSegments` 'rk4' or `segments`
 * 'rk4': on the traction demo RK4 stays within 1e-7 Imax of segments integrated by Cash-Karp at tol
 * 1e-10, and the exact segments within 1e-6 Imax of RK4 over a whole run, see
 * test/switching-stepper.test.ts); any other machine (flux maps) goes through the setup's own
 * stepper (Cash-Karp by default) and the plant's general derivative. The capture for the result
 * is sized from the run's length and the project's window (pwm.window).
 */
export function makeSwitchingStepper(setup: AnySetup, plant: Plant, y: Float64Array, segments: 'auto' | 'rk4' | 'solver' = 'auto'): SwitchingStepper | null {
  const pwm = setup.pwm;
  if (!pwm || pwm.model !== 'switching') return null;
  const Ts = setup.controller.Ts;
  const fast = segments !== 'solver' && plant.model.linear !== null && !plant.fluxStates;
  const exact = fast && segments === 'auto' && setup.solver.switchingSegments !== 'rk4' && plant.params.inputFrame === 'alpha-beta' ? new ExactSegment(plant, setup.Imax) : null;
  const capture = new SwitchingCapture(setup.duration_s * pwm.fsw_Hz, pwm.window ?? null, pwm.fsw_Hz);
  return new SwitchingStepper(plant, Ts, fast ? new Rk4Stepper(plant, Ts, 1) : makeStepper(setup, plant, y), pwm, exact, capture);
}

/**
 * The switching model as the simulator's stepper: each control period the controller's voltage
 * command (the plant's input, alpha-beta) is turned into the legs' duties by the modulator
 * (../drive/pwm-modulator.ts) and the period integrated through the bridge's switching states
 * (switching-period.ts). With one control update per carrier period a control period is a whole
 * carrier period (its rising then its falling half, the same duties); with two it is one half,
 * rising for the even periods and falling for the odd ones (the carrier's valley at t = 0).
 * The command is put back into the plant's input after the period. Allocation-free.
 */
import type { PwmSpec } from '../drive/pwm-spec';
import { legDuties } from '../drive/pwm-modulator';
import type { Plant } from './plant';
import { Rk4Stepper, Stepper, makeStepper } from './stepper';
import { SwitchingPeriod } from './switching-period';
import type { AnySetup } from './simulation-setup';

export class SwitchingStepper extends Stepper {
  readonly bridge: SwitchingPeriod;
  /** the duties of the last period */
  readonly duty = new Float64Array(3);
  constructor(plant: Plant, Ts: number, inner: Stepper, private readonly spec: PwmSpec) {
    super(plant, Ts);
    this.bridge = new SwitchingPeriod(plant, inner, spec);
  }

  override period(y: Float64Array, t0: number, t1: number): void {
    const u = this.plant.input;
    const va = u[0]!, vb = u[1]!;
    const d = this.duty;
    legDuties(va, vb, this.spec.Vdc, this.spec.modulation, d);
    if (this.spec.updatesPerPeriod === 1) {
      const tm = 0.5 * (t0 + t1);
      this.bridge.half(y, t0, tm, d, true, false); // the zero state about the peak stays one segment
      this.bridge.half(y, tm, t1, d, false);
    } else {
      this.bridge.half(y, t0, t1, d, (Math.round(t0 / this.Ts) & 1) === 0);
    }
    u[0] = va;
    u[1] = vb;
  }

  protected piece(): void {
    throw new Error('SwitchingStepper integrates by period only');
  }
}

/**
 * The stepper of a setup: the switching model when `pwm.model` is 'switching', else null (the
 * averaged model). The segments of a constant-parameter machine (current states) take one classical
 * RK4 step each (a segment is at most a control period and mostly far shorter: on the traction demo
 * the run stays within 1e-7 Imax of segments integrated by Cash-Karp at tol 1e-10, see
 * test/switching-stepper.test.ts); any other machine (flux maps) goes through the setup's own
 * stepper (Cash-Karp by default) and the plant's general derivative.
 */
export function makeSwitchingStepper(setup: AnySetup, plant: Plant, y: Float64Array, segments: 'auto' | 'solver' = 'auto'): SwitchingStepper | null {
  const pwm = setup.pwm;
  if (!pwm || pwm.model !== 'switching') return null;
  const Ts = setup.controller.Ts;
  const fast = segments === 'auto' && plant.model.linear !== null && !plant.fluxStates;
  return new SwitchingStepper(plant, Ts, fast ? new Rk4Stepper(plant, Ts, 1) : makeStepper(setup, plant, y), pwm);
}

/**
 * Requirement points marked continuous against the thermal rating: each point's S1 torque at its
 * speed (continuous-torque.ts, motoring or generating by the sign of the power asked) and the
 * thermally coupled steady state of the point itself (thermal-steady-state.ts), so that a sizing
 * table can say whether the point can be held indefinitely and how warm it runs.
 */
import type { DriveLimits } from '../drive/inverter-spec';
import type { TemperatureModel } from '../machine/temperature-model';
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { Requirement } from './operating-point-types';
import type { LossConditions } from './point-losses';
import { RPM_TO_RAD_S } from '../base/units';
import { continuousTorqueCurve, type ContinuousLimit } from './continuous-torque';
import { coupledSteadyState, type CoupledStatus } from './thermal-steady-state';

export interface ContinuousRequirementCheck {
  label: string;
  speed_rpm: number;
  torque_Nm: number;
  /** the S1 torque at the point's speed on the point's side (the sign of the point's torque), N·m */
  s1Torque_Nm: number;
  /** what bounds the S1 torque there */
  s1LimitedBy: ContinuousLimit;
  /** |torque| <= |S1 torque| (to 1e-9 relative) */
  underS1: boolean;
  /** the point's own coupled steady state: status and temperatures, °C */
  status: CoupledStatus;
  windingTemp_C: number;
  magnetTemp_C: number;
  junctionTemp_C: number;
  /** |i_dq| at the point, A peak */
  current_A: number;
}

/** The requirement points of continuous duty, checked against the S1 curve (the run owns `tm`). */
export function continuousRequirementChecks(tm: TemperatureModel, net: ThermalNetworkSpec, lim: DriveLimits, c: LossConditions, requirements: readonly Requirement[]): ContinuousRequirementCheck[] {
  const out: ContinuousRequirementCheck[] = [];
  for (const r of requirements) {
    if (r.duty !== 'continuous') continue;
    // reversed rotation is the mirror image of forward rotation with the torque negated (iq mirrored,
    // the same losses): motoring or generating by the sign of the power, not of the torque alone
    const w = Math.abs(r.speed_rpm) * RPM_TO_RAD_S, mirror = r.speed_rpm < 0 ? -1 : 1, T = mirror * r.torque_Nm;
    const s1 = continuousTorqueCurve(tm, net, lim, c, [w], T < 0 ? 'generating' : 'motoring')[0]!;
    const st = coupledSteadyState(tm, net, lim, c, w, T);
    out.push({
      label: r.label, speed_rpm: r.speed_rpm, torque_Nm: r.torque_Nm,
      s1Torque_Nm: mirror * s1.torque_Nm, s1LimitedBy: s1.limitedBy,
      underS1: Math.abs(r.torque_Nm) <= Math.abs(s1.torque_Nm) * (1 + 1e-9),
      status: st.status, windingTemp_C: st.windingTemp_C, magnetTemp_C: st.magnetTemp_C, junctionTemp_C: st.junctionTemp_C, current_A: st.current,
    });
  }
  return out;
}

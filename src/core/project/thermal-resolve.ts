/**
 * The project's `thermal` and `dutyCycle` sections resolved: the thermal network as the engine's
 * ThermalNetworkSpec (its own copy of every list), the duty cycle as three Float64Array columns.
 */
import type { ThermalNetworkSpec } from '../machine/thermal-network-spec';
import type { DutyCycleSection, ThermalSection } from './schema';

/** A duty cycle resolved: samples linear in between (t_s from 0, strictly ascending; rpm; N·m). */
export interface ResolvedDutyCycle {
  label: string;
  t_s: Float64Array;
  speed_rpm: Float64Array;
  torque_Nm: Float64Array;
}

/** The thermal section (validated, defaults filled) -> the network's specification. */
export function thermalNetworkOf(t: ThermalSection): ThermalNetworkSpec {
  const spec: ThermalNetworkSpec = {
    coolantTemp_C: t.coolantTemp_C,
    windingCapacity_J_per_K: t.windingCapacity_J_per_K,
    windingToStator_K_per_W: t.windingToStator_K_per_W,
    statorCapacity_J_per_K: t.statorCapacity_J_per_K,
    statorToCoolant_K_per_W: t.statorToCoolant_K_per_W,
    magnetAboveStator_K: t.magnetAboveStator_K,
    windingMax_C: t.windingMax_C,
    magnetMax_C: t.magnetMax_C,
  };
  if (t.statorToCoolantBySpeed) spec.statorToCoolantBySpeed = { speed_rpm: [...t.statorToCoolantBySpeed.speed_rpm], K_per_W: [...t.statorToCoolantBySpeed.K_per_W] };
  if (t.junctionToCoolant_K_per_W !== undefined && t.junctionMax_C !== undefined) {
    spec.junctionToCoolant_K_per_W = t.junctionToCoolant_K_per_W;
    spec.junctionMax_C = t.junctionMax_C;
  }
  return spec;
}

/** The dutyCycle section (validated) -> its columns as Float64Arrays. */
export function dutyCycleOf(d: DutyCycleSection): ResolvedDutyCycle {
  return { label: d.label, t_s: Float64Array.from(d.t_s), speed_rpm: Float64Array.from(d.speed_rpm), torque_Nm: Float64Array.from(d.torque_Nm) };
}

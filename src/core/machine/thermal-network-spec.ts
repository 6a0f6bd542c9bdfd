/**
 * The lumped thermal network of the motor and the inverter (the project's `thermal` section, resolved):
 *
 *   winding node (C_w) --R_ws-- stator/housing node (C_s) --R_sc(speed)-- coolant at T_c
 *   junction of one switch position --R_jc-- coolant (no heat capacity: steady at every instant)
 *
 * Copper loss enters the winding node, iron loss the stator node, one sixth of the inverter loss each
 * switch position's junction; mechanical loss leaves through the bearings and air, outside the
 * network. The magnet sits `magnetAboveStator_K` above the stator node.
 */
export interface ThermalNetworkSpec {
  coolantTemp_C: number;
  windingCapacity_J_per_K: number;
  windingToStator_K_per_W: number;
  statorCapacity_J_per_K: number;
  /** stator/housing to coolant, K/W (at every speed unless `statorToCoolantBySpeed` is given) */
  statorToCoolant_K_per_W: number;
  /** a self-ventilated motor: stator-to-coolant resistance against |speed|, linear in between and held beyond the ends */
  statorToCoolantBySpeed?: { speed_rpm: readonly number[]; K_per_W: readonly number[] };
  magnetAboveStator_K: number;
  windingMax_C: number;
  magnetMax_C: number;
  /** per switch position; absent: the inverter's junction is not rated */
  junctionToCoolant_K_per_W?: number;
  junctionMax_C?: number;
}

/**
 * The temperature model of a flux-map machine: one FluxMapModel (its interpolant built once) re-tempered
 * in place, the winding's resistance by copper's coefficient (thermal.ts, resistanceAt) and psi_d
 * shifted for the magnet's temperature as fluxMapAt shifts it (alphaBr (T - T_map) psi_d(0, 0) of the
 * map as given), so that at any temperatures it answers exactly as fluxMapAt's model at them.
 */
import type { TemperatureModel } from './temperature-model';
import { FluxMapModel, type FluxMapData } from './flux-map';
import { resistanceAt } from './thermal';

/** The temperature of the winding's given resistance (and of the model until set), °C. */
const REFERENCE_C = 20;

/** A flux map's temperature model, Rs20 the winding's resistance at 20 °C (ohm), alphaBr in 1/K; at 20 °C until set. */
export function fluxMapTemperatureModel(data: FluxMapData, polePairs: number, Rs20: number, alphaBr: number): TemperatureModel {
  const model = new FluxMapModel(data, polePairs, Rs20);
  const f = new Float64Array(2);
  model.flux(0, 0, f);
  const psid00 = f[0]!;
  const setTemperatures = (winding_C: number, magnet_C: number): void => {
    model.retemper(resistanceAt(Rs20, winding_C), alphaBr * (magnet_C - data.magnetTemp_C) * psid00);
  };
  setTemperatures(REFERENCE_C, REFERENCE_C);
  return { model, setTemperatures };
}

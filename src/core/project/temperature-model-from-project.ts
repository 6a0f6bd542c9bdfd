/**
 * The temperature model of a project's machine (machine/temperature-model.ts): a model that one run
 * owns and re-tempers in place as its thermal state moves (winding and magnet temperatures). A
 * constant-parameter motor (a motor section with Ld, Lq, psiM, or a nameplate) from its 20 °C terms;
 * a flux-map motor from its map, re-tempered as the project's resolution tempers it (fluxMapAt).
 */
import type { ResolvedProject } from './project';
import { linearTemperatureModel, type TemperatureModel } from '../machine/temperature-model';
import { fluxMapTemperatureModel } from '../machine/flux-map-temperature-model';

/** A new temperature model of the project's machine (a run's own: never share one), at 20 °C until set. */
export function temperatureModelFromProject(p: ResolvedProject): TemperatureModel {
  const alphaBr = p.conditions.magnetTempCoeff;
  const map = p.file.motor?.fluxMap;
  if (map !== undefined) return fluxMapTemperatureModel(map, p.machine20.polePairs, p.file.motor!.Rs, alphaBr);
  return linearTemperatureModel(p.machine20, alphaBr);
}
